import { sql, type Kysely } from "kysely";

/**
 * Coefficient sets, their immutable revisions, lead reviews and per-channel deployments.
 * Content columns of a revision never change after insert (trigger below, like audit_log);
 * only the workflow columns (state, state_version, timestamps of the transitions) move.
 */
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .createTable("coefficient_sets")
    .addColumn("id", "serial", (c) => c.primaryKey())
    .addColumn("channel_id", "integer", (c) => c.notNull().references("channels.id").onDelete("restrict"))
    .addColumn("name", "text", (c) => c.notNull().check(sql`length(name) between 1 and 120`))
    .addColumn("created_by", "integer", (c) => c.notNull().references("users.id").onDelete("restrict"))
    .addColumn("created_at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn("updated_at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn("latest_revision", "integer", (c) => c.notNull().defaultTo(0))
    .addColumn("retired_at", "timestamptz")
    .addColumn("version", "integer", (c) => c.notNull().defaultTo(1))
    .execute();
  await db.schema.createIndex("coefficient_sets_channel").on("coefficient_sets").column("channel_id").execute();

  await db.schema
    .createTable("revisions")
    .addColumn("id", "serial", (c) => c.primaryKey())
    .addColumn("set_id", "integer", (c) => c.notNull().references("coefficient_sets.id").onDelete("restrict"))
    .addColumn("revision", "integer", (c) => c.notNull().check(sql`revision >= 1`))
    .addColumn("spec", "jsonb", (c) => c.notNull())
    .addColumn("design", "jsonb", (c) => c.notNull())
    .addColumn("device_format", "text", (c) => c.notNull().check(sql`device_format in ('f32','q15','q31')`))
    .addColumn("quantized", "jsonb", (c) => c.notNull())
    .addColumn("analysis", "jsonb", (c) => c.notNull())
    .addColumn("sample_rate_hz", "double precision", (c) => c.notNull().check(sql`sample_rate_hz > 0`))
    .addColumn("author_id", "integer", (c) => c.notNull().references("users.id").onDelete("restrict"))
    .addColumn("notes", "text", (c) => c.notNull().defaultTo(""))
    .addColumn("created_at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn("state", "text", (c) =>
      c.notNull().defaultTo("draft").check(sql`state in ('draft','in_review','approved','rejected')`),
    )
    .addColumn("state_version", "integer", (c) => c.notNull().defaultTo(1))
    .addColumn("state_changed_at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    .addUniqueConstraint("revisions_set_revision", ["set_id", "revision"])
    .execute();
  await db.schema.createIndex("revisions_state").on("revisions").column("state").execute();
  await sql`
    create function revisions_content_immutable() returns trigger language plpgsql as $$
    begin
      if tg_op = 'DELETE' then raise exception 'revisions are immutable: delete refused'; end if;
      if (new.id, new.set_id, new.revision, new.spec, new.design, new.device_format, new.quantized, new.analysis,
          new.sample_rate_hz, new.author_id, new.notes, new.created_at)
         is distinct from
         (old.id, old.set_id, old.revision, old.spec, old.design, old.device_format, old.quantized, old.analysis,
          old.sample_rate_hz, old.author_id, old.notes, old.created_at) then
        raise exception 'revisions are immutable: only the review state may change';
      end if;
      return new;
    end $$`.execute(db);
  await sql`
    create trigger revisions_no_content_change before update or delete on revisions
    for each row execute function revisions_content_immutable()`.execute(db);

  await db.schema
    .createTable("reviews")
    .addColumn("id", "serial", (c) => c.primaryKey())
    .addColumn("revision_id", "integer", (c) => c.notNull().references("revisions.id").onDelete("restrict"))
    .addColumn("reviewer_id", "integer", (c) => c.notNull().references("users.id").onDelete("restrict"))
    .addColumn("decision", "text", (c) => c.notNull().check(sql`decision in ('approved','rejected')`))
    .addColumn("comment", "text", (c) => c.notNull())
    .addColumn("at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    .execute();
  await db.schema.createIndex("reviews_revision").on("reviews").column("revision_id").execute();
  await sql`
    create function reviews_append_only() returns trigger language plpgsql as $$
    begin raise exception 'reviews are append-only'; end $$`.execute(db);
  await sql`
    create trigger reviews_no_change before update or delete on reviews
    for each row execute function reviews_append_only()`.execute(db);

  await db.schema
    .createTable("deployments")
    .addColumn("id", "serial", (c) => c.primaryKey())
    .addColumn("revision_id", "integer", (c) => c.notNull().references("revisions.id").onDelete("restrict"))
    .addColumn("channel_id", "integer", (c) => c.notNull().references("channels.id").onDelete("restrict"))
    .addColumn("kind", "text", (c) => c.notNull().check(sql`kind in ('promote','rollback')`))
    .addColumn("state", "text", (c) =>
      c.notNull().defaultTo("pending").check(sql`state in ('pending','active','superseded','failed','rolled_back')`),
    )
    .addColumn("format", "text", (c) => c.notNull().check(sql`format in ('f32','q15','q31')`))
    .addColumn("config", "jsonb", (c) => c.notNull())
    .addColumn("checksum", "text", (c) => c.notNull().check(sql`checksum ~ '^[0-9a-f]{64}$'`))
    .addColumn("previous_id", "integer", (c) => c.references("deployments.id").onDelete("restrict"))
    .addColumn("requested_by", "integer", (c) => c.notNull().references("users.id").onDelete("restrict"))
    .addColumn("requested_at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn("activated_at", "timestamptz")
    .addColumn("ended_at", "timestamptz")
    .addColumn("reason", "text")
    .execute();
  await sql`create unique index deployments_one_active on deployments (channel_id) where state = 'active'`.execute(db);
  await sql`create unique index deployments_one_pending on deployments (channel_id) where state = 'pending'`.execute(db);
  await db.schema.createIndex("deployments_revision").on("deployments").column("revision_id").execute();
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.dropTable("deployments").execute();
  await sql`drop trigger reviews_no_change on reviews`.execute(db);
  await sql`drop function reviews_append_only()`.execute(db);
  await db.schema.dropTable("reviews").execute();
  await sql`drop trigger revisions_no_content_change on revisions`.execute(db);
  await sql`drop function revisions_content_immutable()`.execute(db);
  await db.schema.dropTable("revisions").execute();
  await db.schema.dropTable("coefficient_sets").execute();
}
