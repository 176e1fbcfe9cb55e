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

/** A stored session that is still live (not revoked, not expired), with its account. */
export interface StoredSession extends StoredAccount {
  session_id: string;
}

/**
 * The one session check: a cookie is valid only while its session is live in the database (signing
 * out revokes it), its account exists and is enabled, and the account's session version is unchanged
 * (a password change or disabling bumps the version).
 */
export function resolveSessionUser(session: SessionData, stored: StoredSession | undefined): SessionUser | null {
  if (!session.userId || !session.sessionId || !stored) return null;
  if (stored.id !== session.userId || stored.session_id !== session.sessionId) return null;
  if (stored.disabled || stored.session_version !== session.sessionVersion) return null;
  return { id: stored.id, email: stored.email, name: stored.display_name, role: stored.role };
}

/** Throws 401 without a user and 403 below the required role; returns the user otherwise. */
export function requireRole(user: SessionUser | null, role: Role): SessionUser {
  if (!user) throw new AppError("unauthorized", "Sign in to continue.");
  if (!roleAtLeast(user.role, role)) throw new AppError("forbidden", `This needs the ${role} role or higher.`);
  return user;
}
