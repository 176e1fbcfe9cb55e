import { sql, type Kysely } from "kysely";

/**
 * API tokens for build pipelines. Only a SHA-256 hash of each token is stored (the token is
 * 256 random bits, so a fast hash is enough; slow password hashes are for guessable secrets).
 */
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .createTable("api_tokens")
    .addColumn("id", "serial", (c) => c.primaryKey())
    .addColumn("user_id", "integer", (c) => c.notNull().references("users.id").onDelete("restrict"))
    .addColumn("name", "text", (c) => c.notNull().check(sql`length(name) between 1 and 80`))
    .addColumn("token_hash", "text", (c) => c.notNull().unique().check(sql`token_hash ~ '^[0-9a-f]{64}$'`))
    .addColumn("scope", "text", (c) => c.notNull().defaultTo("export:read").check(sql`scope in ('export:read')`))
    .addColumn("created_at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn("last_used_at", "timestamptz")
    .addColumn("revoked_at", "timestamptz")
    .execute();
  await db.schema.createIndex("api_tokens_user").on("api_tokens").column("user_id").execute();
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.dropTable("api_tokens").execute();
}
