import type { z } from "zod";
import type { SessionUser } from "@/lib/auth/guard";
import type { Role } from "@/lib/auth/roles";
import { toErrorBody } from "@/lib/errors";
import type { ActionState } from "./action-state";
import { safeParseInput } from "./fields";

/** What an action needs from the request and the database; app/_lib/action.ts supplies them. */
export interface ActionPorts<Trx> {
  /** The caller from the session, refused (AppError 401/403) below `role` or cross-site. */
  requireUser(role: Role): Promise<SessionUser>;
  /** Runs `work` in one database transaction. */
  transaction<T>(work: (trx: Trx) => Promise<T>): Promise<T>;
  /** Marks a path's cached render stale (Next's revalidatePath). */
  revalidate(path: string, type?: "layout" | "page"): void;
  /** Logs the cause of a failure the client sees as an internal error. */
  log(action: string, err: unknown): void;
}

export interface ActionDefinition<S extends z.ZodType, State extends ActionState, Trx> {
  /** Names the action in the log. */
  name: string;
  schema: S;
  role: Role;
  /** What the schema parses; the form's fields by default. */
  input?: (form: FormData) => unknown;
  /** The answer to input that does not parse; the first issue's message and every field's by default. */
  invalid?: (error: z.ZodError) => NoInfer<State> | ActionState;
  /** Paths whose pages show what the action changes, revalidated after it succeeds. */
  revalidate: readonly (string | readonly [string, "layout" | "page"])[];
  act(context: { data: z.output<S>; user: SessionUser; transaction: ActionPorts<Trx>["transaction"] }): Promise<NoInfer<State>>;
}

export type Action<State extends ActionState> = (prev: State, form: FormData) => Promise<State | ActionState>;

/** Each field's first message, and the first of all as the form's message. */
export function invalidFields(error: z.ZodError): ActionState {
  const fieldErrors = Object.fromEntries(error.issues.map((i) => [String(i.path[0] ?? "form"), i.message]));
  return { ok: false, message: Object.values(fieldErrors)[0], fieldErrors };
}

/**
 * Server actions, each one: parse the form (zod) → session and role → the action's work (its
 * transaction when it asks for one) → revalidate what changed → a safe answer. An AppError's message
 * goes back to the form; anything else answers "Something went wrong" and its cause goes to the log.
 */
export function actionMaker<Trx>(ports: ActionPorts<Trx>) {
  return function defineAction<S extends z.ZodType, State extends ActionState = ActionState>(def: ActionDefinition<S, State, Trx>): Action<State> {
    return async (_prev, form) => {
      const parsed = safeParseInput(def.schema, (def.input ?? Object.fromEntries)(form));
      if (!parsed.success) return (def.invalid ?? invalidFields)(parsed.error);
      try {
        const user = await ports.requireUser(def.role);
        const state = await def.act({ data: parsed.data, user, transaction: (work) => ports.transaction(work) });
        for (const path of def.revalidate) {
          if (typeof path === "string") ports.revalidate(path);
          else ports.revalidate(path[0], path[1]);
        }
        return state;
      } catch (err) {
        const { status, body } = toErrorBody(err);
        if (status >= 500) ports.log(def.name, err);
        return { ok: false, message: body.error.message };
      }
    };
  };
}
