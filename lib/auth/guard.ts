import { AppError } from "@/lib/errors";
import { roleAtLeast, type Role } from "./roles";
import type { SessionData } from "./session-config";

/** The signed-in person as every handler sees them. */
export interface SessionUser {
  id: number;
  email: string;
  name: string;
  role: Role;
}

/** What the guard needs to know of the stored account. */
export interface StoredAccount {
  id: number;
  email: string;
  display_name: string;
  role: Role;
  disabled: boolean;
  session_version: number;
}

/**
 * The one session check: a cookie is valid only while its account exists, is enabled and its
 * session version is unchanged (a password change or disabling bumps the version).
 */
export function resolveSessionUser(session: SessionData, account: StoredAccount | undefined): SessionUser | null {
  if (!session.userId || !account || account.id !== session.userId) return null;
  if (account.disabled || account.session_version !== session.sessionVersion) return null;
  return { id: account.id, email: account.email, name: account.display_name, role: account.role };
}

/** Throws 401 without a user and 403 below the required role; returns the user otherwise. */
export function requireRole(user: SessionUser | null, role: Role): SessionUser {
  if (!user) throw new AppError("unauthorized", "Sign in to continue.");
  if (!roleAtLeast(user.role, role)) throw new AppError("forbidden", `This needs the ${role} role or higher.`);
  return user;
}
