import { headers } from "next/headers";
import { redirect } from "next/navigation";
import { cache } from "react";
import { db } from "@/db";
import { liveSessionAccount } from "@/db/queries/sessions";
import { requireRole, resolveSessionUser, type SessionUser } from "@/lib/auth/guard";
import { roleAtLeast, type Role } from "@/lib/auth/roles";
import { readSession } from "@/lib/auth/session";
import { requireSameOrigin } from "@/lib/http/handler";

/** The signed-in user for this request: the cookie's session must be live in the database (once per request). */
export const currentUser = cache(async (): Promise<SessionUser | null> => {
  const session = await readSession();
  if (!session.userId || !session.sessionId) return null;
  return resolveSessionUser(session, await liveSessionAccount(db(), session.sessionId));
});

/** For route handlers: 401/403 as AppError. */
export async function requireUser(role: Role = "operator"): Promise<SessionUser> {
  return requireRole(await currentUser(), role);
}

/**
 * For server actions: the request must come from the app's own pages (an action is always a POST;
 * a missing Origin is refused too), then 401/403 as AppError.
 */
export async function requireActionUser(role: Role = "operator"): Promise<SessionUser> {
  requireSameOrigin("POST", await headers(), { originRequired: true });
  return requireUser(role);
}

/** For pages: sends a visitor to sign in, and a user without the role to the refusal page. */
export async function requirePageUser(role: Role = "operator"): Promise<SessionUser> {
  const user = await currentUser();
  if (!user) redirect("/sign-in");
  if (!roleAtLeast(user.role, role)) redirect(`/denied?need=${role}`);
  return user;
}
