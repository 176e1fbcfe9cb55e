import { sql, type Kysely } from "kysely";

/**
 * The mail outbox (written in the transaction of the event it announces, drained by the sidecar's
 * sender with retries) and the development mailbox the SMTP fake stores every received message in.
 */
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .createTable("mail_outbox")
    .addColumn("id", "bigserial", (c) => c.primaryKey())
    .addColumn("kind", "text", (c) => c.notNull())
    .addColumn("recipients", sql`text[]`, (c) => c.notNull())
    .addColumn("subject", "text", (c) => c.notNull())
    .addColumn("body", "text", (c) => c.notNull())
    .addColumn("created_at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn("attempts", "integer", (c) => c.notNull().defaultTo(0))
    .addColumn("next_attempt_at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn("sent_at", "timestamptz")
    .addColumn("last_error", "text")
    .execute();
  await sql`create index mail_outbox_due on mail_outbox (next_attempt_at) where sent_at is null`.execute(db);

  await db.schema
    .createTable("mailbox")
    .addColumn("id", "bigserial", (c) => c.primaryKey())
    .addColumn("received_at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn("envelope_from", "text", (c) => c.notNull())
    .addColumn("envelope_to", sql`text[]`, (c) => c.notNull())
    .addColumn("subject", "text", (c) => c.notNull())
    .addColumn("body", "text", (c) => c.notNull())
    .addColumn("raw", "text", (c) => c.notNull())
    .execute();
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.dropTable("mailbox").execute();
  await db.schema.dropTable("mail_outbox").execute();
}
