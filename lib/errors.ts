/** The closed set of error codes a client may see, each with its HTTP status. */
export const ERROR_STATUS = {
  bad_request: 400,
  unauthorized: 401,
  forbidden: 403,
  not_found: 404,
  conflict: 409,
  too_large: 413,
  unprocessable: 422,
  too_many_requests: 429,
  internal: 500,
  unavailable: 503,
} as const;

export type ErrorCode = keyof typeof ERROR_STATUS;

/** An error meant for the client: its message is safe to show; causes go to the log only. */
export class AppError extends Error {
  constructor(
    readonly code: ErrorCode,
    message: string,
    readonly details?: unknown,
  ) {
    super(message);
    this.name = "AppError";
  }
}

/** 429 that says how long to wait: `retryAfterSeconds` goes out as the Retry-After header and in the details. */
export class RetryLater extends AppError {
  constructor(
    message: string,
    readonly retryAfterSeconds: number,
  ) {
    super("too_many_requests", message, { retryAfterSeconds });
  }
}

export interface ErrorBody {
  error: { code: ErrorCode; message: string; details?: unknown };
}

/** Maps anything thrown to a status and a body that never carries a stack or a cause. */
export function toErrorBody(err: unknown): { status: number; body: ErrorBody } {
  if (err instanceof AppError) {
    const body: ErrorBody = { error: { code: err.code, message: err.message } };
    if (err.details !== undefined) body.error.details = err.details;
    return { status: ERROR_STATUS[err.code], body };
  }
  if (isDatabaseDown(err)) {
    return { status: 503, body: { error: { code: "unavailable", message: "The database is not reachable. Try again shortly." } } };
  }
  return { status: 500, body: { error: { code: "internal", message: "Something went wrong on the server." } } };
}

const DOWN_CODES = new Set(["ECONNREFUSED", "ECONNRESET", "ETIMEDOUT", "57P01", "57P03", "08006", "08001"]);

/** Whether an error means PostgreSQL could not be reached (pg and node error codes). */
export function isDatabaseDown(err: unknown): boolean {
  const seen = new Set<unknown>();
  let e: unknown = err;
  while (e && typeof e === "object" && !seen.has(e)) {
    seen.add(e);
    const code = (e as { code?: unknown }).code;
    if (typeof code === "string" && DOWN_CODES.has(code)) return true;
    // pg-pool throws these two as plain Errors without a code: their message is all there is to go by.
    if (e instanceof Error && /timeout exceeded when trying to connect|Connection terminated/i.test(e.message)) return true;
    const inner = (e as { errors?: unknown[] }).errors;
    if (Array.isArray(inner) && inner.some(isDatabaseDown)) return true;
    e = (e as { cause?: unknown }).cause;
  }
  return false;
}

/** The message of anything thrown, for a log line or a form: an Error's message, anything else as text. */
export function errorMessage(err: unknown): string {
  return err instanceof Error ? err.message : String(err);
}
