import { sql, type Transaction } from "kysely";
import type { MailMessage } from "@/lib/mail/templates";
import type { Db } from "../client";
import type { Database } from "../types";


/** Writes a message to the outbox; call it in the transaction of the event it announces. No-op without recipients. */
export async function enqueueMail(db: Db, recipients: string[], message: MailMessage): Promise<void> {
  const to = [...new Set(recipients)].sort();
  if (to.length === 0) return;
  await db
    .insertInto("mail_outbox")
    .values({ kind: message.kind, recipients: to, subject: message.subject, body: message.body })
    .execute();
  await sql`select pg_notify('tapwright_mail', '')`.execute(db);
}

/** E-mail addresses of enabled leads (review requests and deployment news go to them). */
export async function leadAddresses(db: Db): Promise<string[]> {
  const rows = await db.selectFrom("users").select("email").where("role", "=", "lead").where("disabled", "=", false).execute();
  return rows.map((r) => r.email);
}

/** E-mail addresses of every enabled account (critical alarms go to the whole lab). */
export async function labAddresses(db: Db): Promise<string[]> {
  const rows = await db.selectFrom("users").select("email").where("disabled", "=", false).execute();
  return rows.map((r) => r.email);
}

export async function userAddress(db: Db, id: number): Promise<string[]> {
  const row = await db.selectFrom("users").select(["email", "disabled"]).where("id", "=", id).executeTakeFirst();
  return row && !row.disabled ? [row.email] : [];
}

export interface OutboxMessage {
  id: string;
  recipients: string[];
  subject: string;
  body: string;
  attempts: number;
}

/** Due unsent messages, locked for this transaction so two senders never send one message twice. */
export function lockDueMail(trx: Transaction<Database>, now: Date, limit: number): Promise<OutboxMessage[]> {
  return trx
    .selectFrom("mail_outbox")
    .select(["id", "recipients", "subject", "body", "attempts"])
    .where("sent_at", "is", null)
    .where("next_attempt_at", "<=", now)
    .orderBy("id")
    .limit(limit)
    .forUpdate()
    .skipLocked()
    .execute();
}

export async function markMailSent(db: Db, id: string, at: Date): Promise<void> {
  await db.updateTable("mail_outbox").set({ sent_at: at, attempts: sql<number>`attempts + 1`, last_error: null }).where("id", "=", id).execute();
}

export async function markMailFailed(db: Db, id: string, error: string, nextAttemptAt: Date): Promise<void> {
  await db
    .updateTable("mail_outbox")
    .set({ attempts: sql<number>`attempts + 1`, last_error: error.slice(0, 500), next_attempt_at: nextAttemptAt })
    .where("id", "=", id)
    .execute();
}

export interface ReceivedMail {
  envelopeFrom: string;
  envelopeTo: string[];
  subject: string;
  body: string;
  raw: string;
}

/** Stores a message the SMTP fake received. */
export async function storeReceivedMail(db: Db, m: ReceivedMail): Promise<void> {
  await db
    .insertInto("mailbox")
    .values({ envelope_from: m.envelopeFrom, envelope_to: m.envelopeTo, subject: m.subject, body: m.body, raw: m.raw })
    .execute();
}

export function listMailbox(db: Db, limit = 200) {
  return db
    .selectFrom("mailbox")
    .select(["id", "received_at as receivedAt", "envelope_from as from", "envelope_to as to", "subject", "body"])
    .orderBy("id", "desc")
    .limit(limit)
    .execute();
}

export function outboxBacklog(db: Db) {
  return db
    .selectFrom("mail_outbox")
    .select(["id", "subject", "recipients", "attempts", "next_attempt_at as nextAttemptAt", "last_error as lastError"])
    .where("sent_at", "is", null)
    .orderBy("id")
    .limit(100)
    .execute();
}
