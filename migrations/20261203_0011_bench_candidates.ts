import { sql, type Kysely } from "kysely";

/**
 * The bench's candidates, kept per engineer and channel until removed (so a reload or a new sign-in
 * finds them again). `key` is the candidate's id on the bench and the stream, chosen by the browser;
 * `color_index` keeps its colour and letter. The count per engineer and channel is bounded by the
 * application (six, like the stream), the spec's size by a check here as well.
 */
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .createTable("bench_candidates")
    .addColumn("id", "serial", (c) => c.primaryKey())
    .addColumn("user_id", "integer", (c) => c.notNull().references("users.id").onDelete("cascade"))
    .addColumn("channel_id", "integer", (c) => c.notNull().references("channels.id").onDelete("cascade"))
    .addColumn("key", "text", (c) => c.notNull().check(sql`key ~ '^[A-Za-z0-9_-]{1,32}$'`))
    .addColumn("color_index", "smallint", (c) => c.notNull().check(sql`color_index between 0 and 5`))
    .addColumn("spec", "jsonb", (c) => c.notNull().check(sql`octet_length(spec::text) <= 65536`))
    .addColumn("created_at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn("updated_at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    .addUniqueConstraint("bench_candidates_user_channel_key", ["user_id", "channel_id", "key"])
    .execute();
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.dropTable("bench_candidates").execute();
}
