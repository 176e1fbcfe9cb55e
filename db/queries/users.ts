import { sql } from "kysely";
import type { Role } from "@/lib/auth/roles";
import type { Db } from "../client";
import type { Database, User } from "../types";
import type { Transaction } from "kysely";

type Conn = Db | Transaction<Database>;

export function findUserById(db: Conn, id: number): Promise<User | undefined> {
  return db.selectFrom("users").selectAll().where("id", "=", id).executeTakeFirst();
}

export function findUserByEmail(db: Conn, email: string): Promise<User | undefined> {
  return db.selectFrom("users").selectAll().where("email", "=", email.toLowerCase()).executeTakeFirst();
}

export function listUsers(db: Conn): Promise<User[]> {
  return db.selectFrom("users").selectAll().orderBy("role").orderBy("email").execute();
}

export function insertUser(
  db: Conn,
  user: { email: string; displayName: string; passwordHash: string; role: Role },
): Promise<User> {
  return db
    .insertInto("users")
    .values({ email: user.email.toLowerCase(), display_name: user.displayName, password_hash: user.passwordHash, role: user.role })
    .returningAll()
    .executeTakeFirstOrThrow();
}

/** Changes role, disabled flag or password; disabling or a new password ends every session. */
export function updateUser(
  db: Conn,
  id: number,
  change: { role?: Role; disabled?: boolean; passwordHash?: string; displayName?: string },
): Promise<User | undefined> {
  const endsSessions = change.disabled === true || change.passwordHash !== undefined;
  return db
    .updateTable("users")
    .set({
      ...(change.role !== undefined && { role: change.role }),
      ...(change.disabled !== undefined && { disabled: change.disabled }),
      ...(change.passwordHash !== undefined && { password_hash: change.passwordHash }),
      ...(change.displayName !== undefined && { display_name: change.displayName }),
      ...(endsSessions && { session_version: sql<number>`session_version + 1` }),
    })
    .where("id", "=", id)
    .returningAll()
    .executeTakeFirst();
}

export async function recordLoginFailure(db: Conn, email: string, address: string | null): Promise<void> {
  await db.insertInto("login_failures").values({ email: email.toLowerCase(), address: address ?? "" }).execute();
}

/** Failures inside the window, per account and per address (0 when the address is unknown). */
export async function countLoginFailures(
  db: Conn,
  email: string,
  address: string | null,
  windowMs: number,
): Promise<{ account: number; address: number }> {
  const since = new Date(Date.now() - windowMs);
  const row = await db
    .selectFrom("login_failures")
    .select([
      sql<number>`count(*) filter (where email = ${email.toLowerCase()})::int`.as("account"),
      sql<number>`count(*) filter (where address <> '' and address = ${address ?? ""})::int`.as("address"),
    ])
    .where("at", ">", since)
    .executeTakeFirstOrThrow();
  return { account: row.account, address: row.address };
}

export async function clearLoginFailures(db: Conn, email: string): Promise<void> {
  await db.deleteFrom("login_failures").where("email", "=", email.toLowerCase()).execute();
}

/** The accounts behind open live connections, in one query (the sidecar's session recheck). */
export function accountsByIds(db: Conn, ids: number[]): Promise<Pick<User, "id" | "email" | "display_name" | "role" | "disabled" | "session_version">[]> {
  if (!ids.length) return Promise.resolve([]);
  return db.selectFrom("users").select(["id", "email", "display_name", "role", "disabled", "session_version"]).where("id", "in", ids).execute();
}
