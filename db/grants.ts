import { sql, type Kysely } from "kysely";

/**
 * What the app's database role may do, table by table. Every table of the app gets select, insert,
 * update and delete unless it is listed here with less; nothing ever gets TRUNCATE, REFERENCES or
 * TRIGGER, and the role owns nothing, so it cannot alter, drop or disable a trigger on anything.
 */
export const APP_TABLE_PRIVILEGES: Record<string, Array<"select" | "insert">> = {
  /** Append-only: entries are written with their change and read by leads, never changed or removed. */
  audit_log: ["select", "insert"],
  /** A lead's sign-off is never changed. */
  reviews: ["select", "insert"],
  /** The migrator's bookkeeping is the owner's alone. */
  kysely_migration: [],
  kysely_migration_lock: [],
};

const ROLE_NAME = /^[a-z_][a-z0-9_]{0,62}$/;

/**
 * Grants the app's role exactly its privileges on the current schema (run by the owner after every
 * migration, so new tables are covered): all of them revoked first, then table privileges per
 * APP_TABLE_PRIVILEGES, and the sequences behind serial ids.
 */
export async function grantAppRole(db: Kysely<any>, role: string): Promise<void> {
  if (!ROLE_NAME.test(role)) throw new Error(`"${role}" is not a role name this grant accepts`);
  const who = sql.id(role);
  await sql`revoke all on all tables in schema public from ${who}`.execute(db);
  await sql`revoke all on all sequences in schema public from ${who}`.execute(db);
  await sql`grant usage on schema public to ${who}`.execute(db);
  await sql`grant select, insert, update, delete on all tables in schema public to ${who}`.execute(db);
  for (const [table, privileges] of Object.entries(APP_TABLE_PRIVILEGES)) {
    const exists = await sql<{ found: boolean }>`select to_regclass(${`public.${table}`}) is not null as found`.execute(db);
    if (!exists.rows[0]?.found) continue;
    await sql`revoke all on ${sql.table(table)} from ${who}`.execute(db);
    if (privileges.length) await sql`grant ${sql.raw(privileges.join(", "))} on ${sql.table(table)} to ${who}`.execute(db);
  }
  await sql`grant usage on all sequences in schema public to ${who}`.execute(db);
}
