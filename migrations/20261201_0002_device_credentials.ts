import { sql, type Kysely } from "kysely";

/** Per-device MQTT credentials for the embedded broker; the password is stored as a scrypt hash. */
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .createTable("device_credentials")
    .addColumn("id", "serial", (c) => c.primaryKey())
    .addColumn("device_id", "integer", (c) => c.notNull().references("devices.id").onDelete("cascade"))
    .addColumn("username", "text", (c) => c.notNull().unique().check(sql`length(username) between 1 and 128`))
    .addColumn("password_hash", "text", (c) => c.notNull())
    .addColumn("created_at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    .execute();
  await db.schema.createIndex("device_credentials_device").on("device_credentials").column("device_id").execute();
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.dropTable("device_credentials").execute();
}
