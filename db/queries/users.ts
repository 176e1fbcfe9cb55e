import { sql } from "kysely";
import type { Role } from "@/lib/auth/roles";
import type { Db } from "../client";
import type { User } from "../types";


export function findUserById(db: Db, id: number): Promise<User | undefined> {
  return db.selectFrom("users").selectAll().where("id", "=", id).executeTakeFirst();
}

export function findUserByEmail(db: Db, email: string): Promise<User | undefined> {
  return db.selectFrom("users").selectAll().where("email", "=", email.toLowerCase()).executeTakeFirst();
}

export function listUsers(db: Db): Promise<User[]> {
  return db.selectFrom("users").selectAll().orderBy("role").orderBy("email").execute();
}

export function insertUser(
  db: Db,
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
  db: Db,
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
