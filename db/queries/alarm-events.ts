import { sql, type Transaction } from "kysely";
import type { SessionUser } from "@/lib/auth/guard";
import { alarmMail } from "@/lib/mail/templates";
import type { AlarmEventView, AlarmKind, AlarmSeverity, AlarmSignal, AlarmState, LimitSide } from "@/lib/protocol";
import type { Db } from "../client";
import type { Database } from "../types";
import { appendAudit } from "./audit";
import { channelPathSql } from "./channels";
import { enqueueMail, labAddresses } from "./mail";


/** NOTIFY channel (payload: the event id) every sidecar listens on to push a stored or acknowledged event to its browsers. */
export const ALARM_EVENTS_CHANNEL = "tapwright_alarm_events";

/** An event as the sidecar holds it: its whole current state, written again on every change (times in epoch ms). */
export interface AlarmEventRecord {
  id: string;
  ruleId: number;
  kind: AlarmKind;
  severity: AlarmSeverity;
  signal: AlarmSignal;
  side: LimitSide;
  limit: number;
  state: AlarmState;
  raisedAt: number;
  clearedAt: number | null;
  peak: number;
  revisionId: number | null;
}

export interface AlarmEventFilter {
  channelId?: number;
  rig?: string;
  severity?: AlarmSeverity;
  kind?: AlarmKind;
  /** `open`: raised, or a limit alarm cleared and not yet acknowledged. */
  state?: AlarmState | "open";
  /** Raised at or after / before, epoch ms. */
  from?: number;
  to?: number;
  limit: number;
}

/** The columns of an event as the sidecar holds it. */
const RECORD_COLUMNS = [
  "e.id",
  "e.rule_id as ruleId",
  "e.kind",
  "e.severity",
  "e.signal",
  "e.side",
  "e.limit_value as limit",
  "e.state",
  "e.raised_at as raisedAt",
  "e.cleared_at as clearedAt",
  "e.peak",
  "e.revision_id as revisionId",
] as const;

function eventQuery(db: Db) {
  return db
    .selectFrom("alarm_events as e")
    .innerJoin("alarm_rules as a", "a.id", "e.rule_id")
    .innerJoin("channels as c", "c.id", "e.channel_id")
    .innerJoin("devices as d", "d.id", "c.device_id")
    .innerJoin("rigs as r", "r.id", "d.rig_id")
    .leftJoin("users as u", "u.id", "e.acknowledged_by")
    .select([
      ...RECORD_COLUMNS,
      "a.name as ruleName",
      channelPathSql("r", "d", "c").as("channel"),
      "c.unit",
      "e.acknowledged_at as acknowledgedAt",
      "u.display_name as acknowledgedBy",
      "e.ack_comment as comment",
    ]);
}

type EventRow = Awaited<ReturnType<ReturnType<typeof eventQuery>["executeTakeFirstOrThrow"]>>;

const iso = (d: Date | string) => new Date(d).toISOString();

function view(row: EventRow): AlarmEventView {
  return {
    ...row,
    raisedAt: iso(row.raisedAt),
    clearedAt: row.clearedAt === null ? null : iso(row.clearedAt),
    acknowledgedAt: row.acknowledgedAt === null ? null : iso(row.acknowledgedAt),
  };
}

/** Events newest first (open ones: raised first, then newest), at most `limit`. */
export async function listAlarmEvents(db: Db, f: AlarmEventFilter): Promise<AlarmEventView[]> {
  let q = eventQuery(db);
  if (f.channelId !== undefined) q = q.where("e.channel_id", "=", f.channelId);
  if (f.rig !== undefined) q = q.where("r.key", "=", f.rig);
  if (f.severity !== undefined) q = q.where("e.severity", "=", f.severity);
  if (f.kind !== undefined) q = q.where("e.kind", "=", f.kind);
  if (f.state === "open") q = q.where((eb) => eb.or([eb("e.state", "=", "raised"), eb.and([eb("e.kind", "=", "limit"), eb("e.acknowledged_at", "is", null)])]));
  else if (f.state !== undefined) q = q.where("e.state", "=", f.state);
  if (f.from !== undefined) q = q.where("e.raised_at", ">=", new Date(f.from));
  if (f.to !== undefined) q = q.where("e.raised_at", "<", new Date(f.to));
  if (f.state === "open") q = q.orderBy(sql`e.state = 'raised'`, "desc");
  const rows = await q.orderBy("e.raised_at", "desc").orderBy("e.id").limit(f.limit).execute();
  return rows.map(view);
}

export async function findAlarmEvent(db: Db, id: string): Promise<AlarmEventView | undefined> {
  const row = await eventQuery(db).where("e.id", "=", id).executeTakeFirst();
  return row && view(row);
}

/**
 * Writes the sidecar's events in one transaction: new ones are inserted, known ones move on
 * (a cleared event never goes back to raised; acknowledgements are never touched). A critical
 * limit alarm that is new to the database is mailed through the outbox in the same transaction.
 */
export async function storeAlarmEvents(db: Db, records: readonly AlarmEventRecord[]): Promise<void> {
  if (records.length === 0) return;
  await db.transaction().execute(async (trx) => {
    for (const r of records) {
      const written = await trx
        .insertInto("alarm_events")
        .values({
          id: r.id,
          rule_id: r.ruleId,
          channel_id: (eb) => eb.selectFrom("alarm_rules").select("channel_id").where("id", "=", r.ruleId),
          kind: r.kind,
          severity: r.severity,
          signal: r.signal,
          side: r.side,
          limit_value: r.limit,
          state: r.state,
          raised_at: new Date(r.raisedAt),
          cleared_at: r.clearedAt === null ? null : new Date(r.clearedAt),
          peak: r.peak,
          revision_id: r.revisionId,
        })
        .onConflict((oc) =>
          oc
            .column("id")
            .doUpdateSet((eb) => ({ state: eb.ref("excluded.state"), cleared_at: eb.ref("excluded.cleared_at"), peak: eb.ref("excluded.peak") }))
            .where("alarm_events.state", "=", "raised"),
        )
        .returning(sql<boolean>`xmax = 0`.as("inserted"))
        .executeTakeFirst();
      // Every sidecar pushes it to its browsers, not only the one that raised it (partitioned sidecars).
      if (written) await announceEvent(trx, r.id);
      if (written?.inserted && r.kind === "limit" && r.severity === "critical") {
        const event = await findAlarmEvent(trx, r.id);
        if (event) await enqueueMail(trx, await labAddresses(trx), alarmMail(event));
      }
    }
  });
}

/** Raised events (limit and masked) of enabled rules, for the sidecar to carry on after a restart. */
export async function listRaisedRecords(db: Db): Promise<AlarmEventRecord[]> {
  const rows = await db
    .selectFrom("alarm_events as e")
    .innerJoin("alarm_rules as a", "a.id", "e.rule_id")
    .where("e.state", "=", "raised")
    .where("a.enabled", "=", true)
    .where("a.deleted_at", "is", null)
    .select(RECORD_COLUMNS)
    .execute();
  return rows.map((r) => ({ ...r, raisedAt: new Date(r.raisedAt).getTime(), clearedAt: r.clearedAt === null ? null : new Date(r.clearedAt).getTime() }));
}

/** Acknowledges an event with a comment and its audit entry; undefined when it was acknowledged already. */
export async function acknowledgeAlarmEvent(trx: Transaction<Database>, actor: SessionUser, id: string, comment: string): Promise<AlarmEventView | undefined> {
  const done = await trx
    .updateTable("alarm_events")
    .set({ acknowledged_by: actor.id, acknowledged_at: sql`now()`, ack_comment: comment })
    .where("id", "=", id)
    .where("acknowledged_at", "is", null)
    .executeTakeFirst();
  if (done.numUpdatedRows === BigInt(0)) return undefined;
  const event = await findAlarmEvent(trx, id);
  await appendAudit(trx, {
    actorId: actor.id,
    action: "alarm_event.acknowledge",
    entity: "alarm_event",
    entityId: id,
    after: { rule: event?.ruleName, channel: event?.channel, kind: event?.kind, state: event?.state, comment },
  });
  await announceEvent(trx, id);
  return event;
}

/** Tells every sidecar (NOTIFY, delivered when the transaction commits) that an event changed, so each pushes it to its browsers. */
async function announceEvent(trx: Db, id: string): Promise<void> {
  await sql`select pg_notify(${ALARM_EVENTS_CHANNEL}, ${id})`.execute(trx);
}
