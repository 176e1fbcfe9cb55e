import type { z } from "zod";
import { AppError, toErrorBody } from "@/lib/errors";

/** Wraps a route handler so anything thrown becomes a safe JSON error; causes go to the log. */
export function handler<C>(fn: (req: Request, ctx: C) => Promise<Response>) {
  return async (req: Request, ctx: C): Promise<Response> => {
    try {
      return await fn(req, ctx);
    } catch (err) {
      const { status, body } = toErrorBody(err);
      if (status >= 500) console.error(`[${req.method} ${new URL(req.url).pathname}]`, err);
      return Response.json(body, { status });
    }
  };
}

/** Zod issues as `{path, message}` pairs with dotted paths, for 400 bodies and forms. */
export function issueList(error: z.ZodError): { path: string; message: string }[] {
  return error.issues.map((i) => ({ path: i.path.map(String).join("."), message: i.message }));
}

/** Parses a value with a schema or throws 400 with zod's issue paths. */
export function parseWith<S extends z.ZodType>(schema: S, value: unknown): z.infer<S> {
  const parsed = schema.safeParse(value);
  if (!parsed.success) throw new AppError("bad_request", "Some fields are invalid.", issueList(parsed.error));
  return parsed.data;
}

/** Reads a JSON body and parses it with a schema; 400 for malformed JSON or fields. */
export async function parseBody<S extends z.ZodType>(req: Request, schema: S): Promise<z.infer<S>> {
  let value: unknown;
  try {
    value = await req.json();
  } catch {
    throw new AppError("bad_request", "The request body must be valid JSON.");
  }
  return parseWith(schema, value);
}

/**
 * The caller's address as reported by a front proxy (X-Forwarded-For, X-Real-IP), or null when no
 * proxy reports one: Next route handlers do not see the socket address.
 */
export function clientAddress(req: Request): string | null {
  const forwarded = req.headers.get("x-forwarded-for")?.split(",")[0]?.trim();
  return forwarded || req.headers.get("x-real-ip") || null;
}
