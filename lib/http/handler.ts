import type { z } from "zod";
import { env, appOrigin } from "@/lib/env";
import { AppError, RetryLater, toErrorBody } from "@/lib/errors";
import { readJson } from "./body";
import { clientAddress as resolveClientAddress, trustedProxies } from "./client-address";
import { safeParseInput } from "./fields";
import { changesState, crossSiteRefusal } from "./origin";

/** Refuses a state-changing request that does not come from the app's own pages (403), see crossSiteRefusal. */
export function requireSameOrigin(method: string, headers: Headers, opts: { originRequired?: boolean } = {}): void {
  if (!changesState(method)) return;
  const refusal = crossSiteRefusal(headers, appOrigin(env()), opts);
  if (refusal) throw new AppError("forbidden", `Cross-site request refused: ${refusal}.`);
}

/**
 * Wraps a route handler: state-changing requests must come from the app's own pages (or carry an
 * API token); anything thrown becomes a safe JSON error with causes in the log; answers are never
 * stored by caches unless the route says otherwise (they are per user).
 */
export function handler<C>(fn: (req: Request, ctx: C) => Promise<Response>) {
  return async (req: Request, ctx: C): Promise<Response> => {
    let res: Response;
    try {
      requireSameOrigin(req.method, req.headers);
      res = await fn(req, ctx);
    } catch (err) {
      const { status, body } = toErrorBody(err);
      if (status >= 500 && !(err instanceof AppError)) console.error(`[${req.method} ${new URL(req.url).pathname}]`, err);
      res = Response.json(body, { status });
      if (err instanceof RetryLater) res.headers.set("retry-after", String(err.retryAfterSeconds));
    }
    if (!res.headers.has("cache-control")) res.headers.set("cache-control", "no-store");
    return res;
  };
}

/** Zod issues as `{path, message}` pairs with dotted paths, for 400 bodies and forms. */
export function issueList(error: z.ZodError): { path: string; message: string }[] {
  return error.issues.map((i) => ({ path: i.path.map(String).join("."), message: i.message }));
}

/** Parses a value with a schema or throws 400 with zod's issue paths; unstorable text is refused first. */
export function parseWith<S extends z.ZodType>(schema: S, value: unknown): z.infer<S> {
  const parsed = safeParseInput(schema, value);
  if (!parsed.success) throw new AppError("bad_request", "Some fields are invalid.", issueList(parsed.error));
  return parsed.data;
}

/** Reads a JSON body (at most MAX_JSON_BODY_BYTES) and parses it with a schema; 413 over the limit, 400 for malformed JSON or fields. */
export async function parseBody<S extends z.ZodType>(req: Request, schema: S): Promise<z.infer<S>> {
  return parseWith(schema, await readJson(req, env().MAX_JSON_BODY_BYTES));
}

/** The caller's address: X-Forwarded-For read from the right through the TRUSTED_PROXIES (see client-address.ts). */
export function clientAddress(req: Request): string | null {
  return resolveClientAddress(req.headers.get("x-forwarded-for"), trustedProxies(env().TRUSTED_PROXIES));
}
