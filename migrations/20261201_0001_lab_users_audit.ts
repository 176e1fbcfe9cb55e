import { sql, type Kysely } from "kysely";

export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .createTable("users")
    .addColumn("id", "serial", (c) => c.primaryKey())
    .addColumn("email", "text", (c) => c.notNull().unique())
    .addColumn("display_name", "text", (c) => c.notNull())
    .addColumn("password_hash", "text", (c) => c.notNull())
    .addColumn("role", "text", (c) => c.notNull().check(sql`role in ('operator','engineer','lead','admin')`))
    .addColumn("disabled", "boolean", (c) => c.notNull().defaultTo(false))
    .addColumn("session_version", "integer", (c) => c.notNull().defaultTo(1))
    .addColumn("created_at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    .execute();

  await db.schema
    .createTable("rigs")
    .addColumn("id", "serial", (c) => c.primaryKey())
    .addColumn("key", "text", (c) => c.notNull().unique().check(sql`key ~ '^[a-z0-9][a-z0-9-]{0,62}$'`))
    .addColumn("name", "text", (c) => c.notNull())
    .addColumn("description", "text", (c) => c.notNull().defaultTo(""))
    .execute();

  await db.schema
    .createTable("devices")
    .addColumn("id", "serial", (c) => c.primaryKey())
    .addColumn("rig_id", "integer", (c) => c.notNull().references("rigs.id").onDelete("restrict"))
    .addColumn("key", "text", (c) => c.notNull().check(sql`key ~ '^[a-z0-9][a-z0-9-]{0,62}$'`))
    .addColumn("name", "text", (c) => c.notNull())
    .addColumn("coefficient_format", "text", (c) =>
      c.notNull().defaultTo("f32").check(sql`coefficient_format in ('f32','q15','q31')`),
    )
    .addUniqueConstraint("devices_rig_key", ["rig_id", "key"])
    .execute();

  await db.schema
    .createTable("channels")
    .addColumn("id", "serial", (c) => c.primaryKey())
    .addColumn("device_id", "integer", (c) => c.notNull().references("devices.id").onDelete("restrict"))
    .addColumn("key", "text", (c) => c.notNull().check(sql`key ~ '^[a-z0-9][a-z0-9-]{0,62}$'`))
    .addColumn("name", "text", (c) => c.notNull())
    .addColumn("unit", "text", (c) => c.notNull())
    .addColumn("sample_rate_hz", "double precision", (c) => c.notNull().check(sql`sample_rate_hz > 0`))
    .addColumn("range_min", "double precision", (c) => c.notNull())
    .addColumn("range_max", "double precision", (c) => c.notNull())
    .addUniqueConstraint("channels_device_key", ["device_id", "key"])
    .addCheckConstraint("channels_range", sql`range_min < range_max`)
    .execute();

  await db.schema
    .createTable("audit_log")
    .addColumn("id", "bigserial", (c) => c.primaryKey())
    .addColumn("at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn("actor_id", "integer", (c) => c.references("users.id").onDelete("set null"))
    .addColumn("action", "text", (c) => c.notNull())
    .addColumn("entity", "text", (c) => c.notNull())
    .addColumn("entity_id", "text")
    .addColumn("before", "jsonb")
    .addColumn("after", "jsonb")
    .execute();
  await db.schema.createIndex("audit_log_at").on("audit_log").column("at").execute();
  await sql`
    create function audit_log_append_only() returns trigger language plpgsql as $$
    begin raise exception 'audit_log is append-only'; end $$`.execute(db);
  await sql`
    create trigger audit_log_no_change before update or delete on audit_log
    for each row execute function audit_log_append_only()`.execute(db);

  await db.schema
    .createTable("login_failures")
    .addColumn("id", "bigserial", (c) => c.primaryKey())
    .addColumn("at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn("email", "text", (c) => c.notNull())
    .addColumn("address", "text", (c) => c.notNull())
    .execute();
  await db.schema.createIndex("login_failures_email_at").on("login_failures").columns(["email", "at"]).execute();
  await db.schema.createIndex("login_failures_address_at").on("login_failures").columns(["address", "at"]).execute();
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.dropTable("login_failures").execute();
  await sql`drop trigger audit_log_no_change on audit_log`.execute(db);
  await sql`drop function audit_log_append_only()`.execute(db);
  await db.schema.dropTable("audit_log").execute();
  await db.schema.dropTable("channels").execute();
  await db.schema.dropTable("devices").execute();
  await db.schema.dropTable("rigs").execute();
  await db.schema.dropTable("users").execute();
}
