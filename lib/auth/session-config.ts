import type { SessionOptions } from "iron-session";

/** What the sealed cookie holds: who, which generation of their sessions, and which stored session (revocable). */
export interface SessionData {
  userId?: number;
  sessionVersion?: number;
  sessionId?: string;
}

export const SESSION_COOKIE = "tapwright_session";

/** How long a session lasts, seconds (the cookie's seal and the stored session alike). */
export const SESSION_TTL_SECONDS = 60 * 60 * 12;

/** iron-session options; free of Next imports so the sidecar can unseal the same cookie. */
export function sessionOptions(secret: string, secure: boolean): SessionOptions {
  return {
    password: secret,
    cookieName: SESSION_COOKIE,
    ttl: SESSION_TTL_SECONDS,
    cookieOptions: { httpOnly: true, sameSite: "lax", secure, path: "/" },
  };
}
