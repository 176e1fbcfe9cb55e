import type { SessionOptions } from "iron-session";

/** What the sealed cookie holds: who, and which generation of their sessions. */
export interface SessionData {
  userId?: number;
  sessionVersion?: number;
}

export const SESSION_COOKIE = "tapwright_session";

/** iron-session options; free of Next imports so the sidecar can unseal the same cookie. */
export function sessionOptions(secret: string, secure: boolean): SessionOptions {
  return {
    password: secret,
    cookieName: SESSION_COOKIE,
    ttl: 60 * 60 * 12,
    cookieOptions: { httpOnly: true, sameSite: "lax", secure, path: "/" },
  };
}
