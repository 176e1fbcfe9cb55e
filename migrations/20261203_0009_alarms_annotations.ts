import { sql, type Kysely } from "kysely";

/**
 * Alarm rules per channel (soft-deleted so their events keep a name), the alarm events the sidecar
 * writes (keyed by the uuid it gives each event, so a write retried after a database outage lands
 * once), and annotations: notes on a moment or a span of a channel.
 */
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .createTable("alarm_rules")
    .addColumn("id", "serial", (c) => c.primaryKey())
    .addColumn("channel_id", "integer", (c) => c.notNull().references("channels.id").onDelete("restrict"))
    .addColumn("name", "text", (c) => c.notNull().check(sql`length(name) between 1 and 80`))
    .addColumn("signal", "text", (c) => c.notNull().check(sql`signal in ('filtered','raw')`))
    .addColumn("high", "double precision")
    .addColumn("low", "double precision")
    .addColumn("deadband", "double precision", (c) => c.notNull().check(sql`deadband >= 0`))
    .addColumn("min_duration_ms", "integer", (c) => c.notNull().check(sql`min_duration_ms between 0 and 3600000`))
    .addColumn("severity", "text", (c) => c.notNull().check(sql`severity in ('advisory','warning','critical')`))
    .addColumn("enabled", "boolean", (c) => c.notNull().defaultTo(true))
    .addColumn("created_by", "integer", (c) => c.notNull().references("users.id").onDelete("restrict"))
    .addColumn("created_at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn("updated_at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn("deleted_at", "timestamptz")
    .addCheckConstraint("alarm_rules_a_limit", sql`high is not null or low is not null`)
    .addCheckConstraint("alarm_rules_ordered", sql`high is null or low is null or (low < high and deadband < high - low)`)
    .execute();
  await sql`create index alarm_rules_channel on alarm_rules (channel_id) where deleted_at is null`.execute(db);

  await db.schema
    .createTable("alarm_events")
    .addColumn("id", "uuid", (c) => c.primaryKey())
    .addColumn("rule_id", "integer", (c) => c.notNull().references("alarm_rules.id").onDelete("restrict"))
    .addColumn("channel_id", "integer", (c) => c.notNull().references("channels.id").onDelete("restrict"))
    .addColumn("kind", "text", (c) => c.notNull().check(sql`kind in ('limit','masked')`))
    .addColumn("severity", "text", (c) => c.notNull().check(sql`severity in ('advisory','warning','critical')`))
    .addColumn("signal", "text", (c) => c.notNull().check(sql`signal in ('filtered','raw')`))
    .addColumn("side", "text", (c) => c.notNull().check(sql`side in ('high','low')`))
    .addColumn("limit_value", "double precision", (c) => c.notNull())
    .addColumn("state", "text", (c) => c.notNull().check(sql`state in ('raised','cleared')`))
    .addColumn("raised_at", "timestamptz", (c) => c.notNull())
    .addColumn("cleared_at", "timestamptz")
    .addColumn("peak", "double precision", (c) => c.notNull())
    .addColumn("revision_id", "integer", (c) => c.references("revisions.id").onDelete("restrict"))
    .addColumn("acknowledged_by", "integer", (c) => c.references("users.id").onDelete("restrict"))
    .addColumn("acknowledged_at", "timestamptz")
    .addColumn("ack_comment", "text", (c) => c.check(sql`length(ack_comment) between 1 and 500`))
    .addColumn("stored_at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    .addCheckConstraint("alarm_events_cleared", sql`(state = 'cleared') = (cleared_at is not null)`)
    .addCheckConstraint("alarm_events_ack", sql`(acknowledged_by is null) = (acknowledged_at is null) and (acknowledged_at is null) = (ack_comment is null)`)
    .execute();
  await db.schema.createIndex("alarm_events_channel_time").on("alarm_events").columns(["channel_id", "raised_at"]).execute();
  await db.schema.createIndex("alarm_events_time").on("alarm_events").column("raised_at").execute();
  await sql`create index alarm_events_open on alarm_events (raised_at) where state = 'raised' or (kind = 'limit' and acknowledged_at is null)`.execute(db);

  await db.schema
    .createTable("annotations")
    .addColumn("id", "serial", (c) => c.primaryKey())
    .addColumn("channel_id", "integer", (c) => c.notNull().references("channels.id").onDelete("restrict"))
    .addColumn("at", "timestamptz", (c) => c.notNull())
    .addColumn("end_at", "timestamptz")
    .addColumn("text", "text", (c) => c.notNull().check(sql`length(text) between 1 and 500`))
    .addColumn("created_by", "integer", (c) => c.notNull().references("users.id").onDelete("restrict"))
    .addColumn("created_at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    .addCheckConstraint("annotations_span", sql`end_at is null or end_at > at`)
    .execute();
  await db.schema.createIndex("annotations_channel_time").on("annotations").columns(["channel_id", "at"]).execute();
  await db.schema.createIndex("annotations_time").on("annotations").column("at").execute();
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.dropTable("annotations").execute();
  await db.schema.dropTable("alarm_events").execute();
  await db.schema.dropTable("alarm_rules").execute();
}
