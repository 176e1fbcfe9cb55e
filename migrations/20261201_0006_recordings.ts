import { sql, type Kysely } from "kysely";

/**
 * Recordings: samples of one channel stored as float64 little-endian bytes (NaN for a missing sample),
 * with the rate they were taken at. The byte length must hold exactly sample_count samples.
 */
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .createTable("recordings")
    .addColumn("id", "serial", (c) => c.primaryKey())
    .addColumn("channel_id", "integer", (c) => c.notNull().references("channels.id").onDelete("restrict"))
    .addColumn("name", "text", (c) => c.notNull().check(sql`length(name) between 1 and 120`))
    .addColumn("notes", "text", (c) => c.notNull().defaultTo("").check(sql`length(notes) <= 4000`))
    .addColumn("sample_rate_hz", "double precision", (c) => c.notNull().check(sql`sample_rate_hz > 0`))
    .addColumn("started_at", "timestamptz")
    .addColumn("sample_count", "integer", (c) => c.notNull().check(sql`sample_count between 2 and 2000000`))
    .addColumn("missing_count", "integer", (c) => c.notNull().defaultTo(0).check(sql`missing_count >= 0`))
    .addColumn("samples", "bytea", (c) => c.notNull())
    .addColumn("source", "text", (c) => c.notNull().defaultTo("upload").check(sql`source in ('upload')`))
    .addColumn("created_by", "integer", (c) => c.notNull().references("users.id").onDelete("restrict"))
    .addColumn("created_at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    .addCheckConstraint("recordings_samples_length", sql`octet_length(samples) = 8 * sample_count`)
    .execute();
  await db.schema.createIndex("recordings_channel").on("recordings").columns(["channel_id", "created_at"]).execute();
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.dropTable("recordings").execute();
}
