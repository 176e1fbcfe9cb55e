import { randomBytes } from "node:crypto";
import { sql } from "kysely";
import type { StoredAccount } from "@/lib/auth/guard";
import type { Db } from "../client";


/** A live session with its account, as the guard checks it. */
export type SessionAccount = StoredAccount & { session_id: string };

/** Starts a session for a user (256 random bits, base64url) that lasts `ttlSeconds`; expired ones are deleted on the way. */
export async function createSession(db: Db, userId: number, ttlSeconds: number): Promise<string> {
  const id = randomBytes(32).toString("base64url");
  await db.deleteFrom("sessions").where("expires_at", "<", sql<Date>`now()`).execute();
  await db
    .insertInto("sessions")
    .values({ id, user_id: userId, expires_at: sql<Date>`now() + make_interval(secs => ${ttlSeconds})` })
    .execute();
  return id;
}

/** Ends a session at once, wherever copies of its cookie are. */
export async function revokeSession(db: Db, id: string): Promise<void> {
  await db.updateTable("sessions").set({ revoked_at: sql<Date>`now()` }).where("id", "=", id).where("revoked_at", "is", null).execute();
}

/** The accounts behind these sessions while they are live (not revoked, not expired), in one query. */
export function liveSessionAccounts(db: Db, sessionIds: string[]): Promise<SessionAccount[]> {
  if (!sessionIds.length) return Promise.resolve([]);
  return db
    .selectFrom("sessions")
    .innerJoin("users", "users.id", "sessions.user_id")
    .select(["sessions.id as session_id", "users.id", "users.email", "users.display_name", "users.role", "users.disabled", "users.session_version"])
    .where("sessions.id", "in", sessionIds)
    .where("sessions.revoked_at", "is", null)
    .where("sessions.expires_at", ">", sql<Date>`now()`)
    .execute();
}

/** The account behind one live session, or undefined. */
export async function liveSessionAccount(db: Db, sessionId: string): Promise<SessionAccount | undefined> {
  return (await liveSessionAccounts(db, [sessionId]))[0];
}
