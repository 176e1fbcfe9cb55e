import { sql, type Kysely } from "kysely";

/**
 * Channels partitioned across sidecars: each sidecar (its id and the WebSocket URL browsers reach it
 * at) beats a heartbeat into `sidecars`, and holds a lease per channel it filters in `channel_leases`,
 * renewed with the heartbeat. One row per channel, so a channel has at most one holder; a lease past
 * `expires_at` may be taken by another sidecar. Leaving (or a stale row removed) drops its leases.
 */
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .createTable("sidecars")
    .addColumn("id", "text", (c) => c.primaryKey().check(sql`id ~ '^[a-z0-9][a-z0-9-]{0,62}$'`))
    .addColumn("ws_url", "text", (c) => c.notNull().check(sql`ws_url ~ '^wss?://' and length(ws_url) <= 512`))
    .addColumn("started_at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn("heartbeat_at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    .execute();
  await db.schema
    .createTable("channel_leases")
    .addColumn("channel_id", "integer", (c) => c.primaryKey().references("channels.id").onDelete("cascade"))
    .addColumn("sidecar_id", "text", (c) => c.notNull().references("sidecars.id").onDelete("cascade"))
    .addColumn("acquired_at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn("expires_at", "timestamptz", (c) => c.notNull())
    .execute();
  await db.schema.createIndex("channel_leases_sidecar").on("channel_leases").column("sidecar_id").execute();
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.dropTable("channel_leases").execute();
  await db.schema.dropTable("sidecars").execute();
}
