import { sealData } from "iron-session";
import type { Db } from "@/db/client";
import { createSession } from "@/db/queries/sessions";
import { findUserByEmail } from "@/db/queries/users";
import { SESSION_COOKIE, SESSION_TTL_SECONDS } from "@/lib/auth/session-config";

/**
 * The request as the real session guard sees it (next/headers' cookies() and headers()), and the
 * database behind `@/db`, for tests that run route handlers and server actions through the real
 * guard. Mock with:
 *   vi.mock("server-only", () => ({}));
 *   vi.mock("next/headers", async () => (await import("./support/request-context")).nextHeaders);
 *   vi.mock("@/db", async () => (await import("./support/request-context")).dbModule);
 *   vi.mock("react", async (original) => ({ ...(await original<typeof import("react")>()), cache: <F>(fn: F) => fn }));
 * (React's cache() is per request on the server; here every call is its own request.)
 */
export const request = { cookies: new Map<string, string>(), headers: new Headers() };
export const state: { db: Db | null } = { db: null };

export const nextHeaders = {
  cookies: async () => ({
    get: (name: string) => (request.cookies.has(name) ? { name, value: request.cookies.get(name) as string } : undefined),
    set: (name: string | { name: string; value: string }, value?: string) => {
      if (typeof name === "string") request.cookies.set(name, value ?? "");
      else request.cookies.set(name.name, name.value);
    },
  }),
  headers: async () => request.headers,
};

export const dbModule = {
  db: (): Db => {
    if (!state.db) throw new Error("test database not ready");
    return state.db;
  },
};

/** Signs an account in: a stored session and its sealed cookie value (sealed with `secret`). */
export async function sessionCookie(db: Db, email: string, secret: string): Promise<{ cookie: string; sessionId: string }> {
  const user = await findUserByEmail(db, email);
  if (!user) throw new Error(`no user ${email}`);
  const sessionId = await createSession(db, user.id, SESSION_TTL_SECONDS);
  const cookie = await sealData({ userId: user.id, sessionVersion: user.session_version, sessionId }, { password: secret, ttl: SESSION_TTL_SECONDS });
  return { cookie, sessionId };
}

/** Makes the next call run as this signed-in account (or as nobody), with these request headers. */
export async function actAs(email: string | null, headers: Record<string, string>, secret: string): Promise<void> {
  request.cookies.clear();
  if (email) request.cookies.set(SESSION_COOKIE, (await sessionCookie(state.db!, email, secret)).cookie);
  request.headers = new Headers(headers);
}
