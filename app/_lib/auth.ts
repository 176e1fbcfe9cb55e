import { redirect } from "next/navigation";
import { cache } from "react";
import { db } from "@/db";
import { findUserById } from "@/db/queries/users";
import { requireRole, resolveSessionUser, type SessionUser } from "@/lib/auth/guard";
import { roleAtLeast, type Role } from "@/lib/auth/roles";
import { getSession } from "@/lib/auth/session";

/** The signed-in user for this request, checked against the database (once per request). */
export const currentUser = cache(async (): Promise<SessionUser | null> => {
  const session = await getSession();
  if (!session.userId) return null;
  return resolveSessionUser(session, await findUserById(db(), session.userId));
});

/** For route handlers and server actions: 401/403 as AppError. */
export async function requireUser(role: Role = "operator"): Promise<SessionUser> {
  return requireRole(await currentUser(), role);
}

/** For pages: sends a visitor to sign in, and a user without the role to the refusal page. */
export async function requirePageUser(role: Role = "operator"): Promise<SessionUser> {
  const user = await currentUser();
  if (!user) redirect("/sign-in");
  if (!roleAtLeast(user.role, role)) redirect(`/denied?need=${role}`);
  return user;
}
