import { sql, type Kysely } from "kysely";

/**
 * Server-side sessions, so that signing out revokes a session however many copies of its cookie
 * exist; and sign-in throttling as one counter row per key (an account, an address, a browser that
 * has signed in before), updated under a row lock so parallel attempts are counted one by one.
 * The per-attempt login_failures log it replaces is dropped.
 */
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .createTable("sessions")
    .addColumn("id", "text", (c) => c.primaryKey().check(sql`id ~ '^[A-Za-z0-9_-]{43}$'`))
    .addColumn("user_id", "integer", (c) => c.notNull().references("users.id").onDelete("cascade"))
    .addColumn("created_at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn("expires_at", "timestamptz", (c) => c.notNull())
    .addColumn("revoked_at", "timestamptz")
    .execute();
  await db.schema.createIndex("sessions_user").on("sessions").column("user_id").execute();
  await db.schema.createIndex("sessions_expires").on("sessions").column("expires_at").execute();

  await db.schema
    .createTable("login_throttle")
    .addColumn("key", "text", (c) => c.primaryKey())
    .addColumn("failures", "integer", (c) => c.notNull().defaultTo(0).check(sql`failures >= 0`))
    .addColumn("last_failure_at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn("blocked_until", "timestamptz")
    .execute();
  await db.schema.createIndex("login_throttle_last").on("login_throttle").column("last_failure_at").execute();

  await db.schema.dropTable("login_failures").execute();
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema
    .createTable("login_failures")
    .addColumn("id", "bigserial", (c) => c.primaryKey())
    .addColumn("at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn("email", "text", (c) => c.notNull())
    .addColumn("address", "text", (c) => c.notNull())
    .execute();
  await db.schema.createIndex("login_failures_email_at").on("login_failures").columns(["email", "at"]).execute();
  await db.schema.createIndex("login_failures_address_at").on("login_failures").columns(["address", "at"]).execute();
  await db.schema.dropTable("login_throttle").execute();
  await db.schema.dropTable("sessions").execute();
}
