import { sql, type Transaction } from "kysely";
import type { AlarmRule } from "@/lib/alarms";
import type { SessionUser } from "@/lib/auth/guard";
import type { AlarmSeverity, AlarmSignal } from "@/lib/protocol";
import type { Db } from "../client";
import type { Database } from "../types";
import { appendAudit } from "./audit";
import { channelPathSql } from "./channels";


/** NOTIFY channel the sidecar listens on to reload its rules after a change. */
export const ALARM_RULES_CHANNEL = "tapwright_alarm_rules";

/** Most rules one channel may carry (each runs on every sample). */
export const MAX_RULES_PER_CHANNEL = 20;

export interface AlarmRuleView extends AlarmRule {
  channelId: number;
  unit: string;
  createdBy: string;
  createdAt: Date;
  updatedAt: Date;
}

/** The fields a person sets on a rule. */
export interface AlarmRuleInput {
  name: string;
  signal: AlarmSignal;
  high: number | null;
  low: number | null;
  deadband: number;
  minDurationMs: number;
  severity: AlarmSeverity;
  enabled: boolean;
}

function ruleQuery(db: Db) {
  return db
    .selectFrom("alarm_rules as a")
    .innerJoin("channels as c", "c.id", "a.channel_id")
    .innerJoin("devices as d", "d.id", "c.device_id")
    .innerJoin("rigs as r", "r.id", "d.rig_id")
    .innerJoin("users as u", "u.id", "a.created_by")
    .where("a.deleted_at", "is", null)
    .select([
      "a.id",
      "a.channel_id as channelId",
      channelPathSql("r", "d", "c").as("channel"),
      "c.unit",
      "a.name",
      "a.signal",
      "a.high",
      "a.low",
      "a.deadband",
      "a.min_duration_ms as minDurationMs",
      "a.severity",
      "a.enabled",
      "u.display_name as createdBy",
      "a.created_at as createdAt",
      "a.updated_at as updatedAt",
    ]);
}

/** Rules in lab order (rig, device, channel, then name); one channel's when channelId is given. */
export function listAlarmRules(db: Db, filter: { channelId?: number; enabledOnly?: boolean } = {}): Promise<AlarmRuleView[]> {
  let q = ruleQuery(db);
  if (filter.channelId !== undefined) q = q.where("a.channel_id", "=", filter.channelId);
  if (filter.enabledOnly) q = q.where("a.enabled", "=", true);
  return q.orderBy("r.key").orderBy("d.key").orderBy("c.key").orderBy("a.name").orderBy("a.id").execute();
}

export function findAlarmRule(db: Db, id: number): Promise<AlarmRuleView | undefined> {
  return ruleQuery(db).where("a.id", "=", id).executeTakeFirst();
}

/** How many live (not deleted) rules a channel has, with the channel row locked so two creations cannot both pass the limit. */
export async function countChannelRulesLocked(trx: Transaction<Database>, channelId: number): Promise<number> {
  await trx.selectFrom("channels").select("id").where("id", "=", channelId).forUpdate().execute();
  const { n } = await trx
    .selectFrom("alarm_rules")
    .select((eb) => eb.fn.countAll<string>().as("n"))
    .where("channel_id", "=", channelId)
    .where("deleted_at", "is", null)
    .executeTakeFirstOrThrow();
  return Number(n);
}

const auditView = (r: AlarmRuleInput & { channel: string }) => ({
  channel: r.channel,
  name: r.name,
  signal: r.signal,
  high: r.high,
  low: r.low,
  deadband: r.deadband,
  minDurationMs: r.minDurationMs,
  severity: r.severity,
  enabled: r.enabled,
});

const columns = (r: AlarmRuleInput) => ({
  name: r.name,
  signal: r.signal,
  high: r.high,
  low: r.low,
  deadband: r.deadband,
  min_duration_ms: r.minDurationMs,
  severity: r.severity,
  enabled: r.enabled,
});

async function announce(trx: Transaction<Database>): Promise<void> {
  await sql`select pg_notify(${ALARM_RULES_CHANNEL}, '')`.execute(trx);
}

/** Creates a rule with its audit entry and tells the sidecar; run inside the caller's transaction. */
export async function createAlarmRule(
  trx: Transaction<Database>,
  actor: SessionUser,
  channel: { id: number; path: string },
  input: AlarmRuleInput,
): Promise<AlarmRuleView> {
  const { id } = await trx
    .insertInto("alarm_rules")
    .values({ channel_id: channel.id, created_by: actor.id, ...columns(input) })
    .returning("id")
    .executeTakeFirstOrThrow();
  await appendAudit(trx, { actorId: actor.id, action: "alarm_rule.create", entity: "alarm_rule", entityId: id, after: auditView({ ...input, channel: channel.path }) });
  await announce(trx);
  return (await findAlarmRule(trx, id))!;
}

/** Replaces a rule's settings with its audit entry (before and after); false when it no longer exists. */
export async function updateAlarmRule(trx: Transaction<Database>, actor: SessionUser, before: AlarmRuleView, next: AlarmRuleInput): Promise<AlarmRuleView | undefined> {
  const updated = await trx
    .updateTable("alarm_rules")
    .set({ ...columns(next), updated_at: sql`now()` })
    .where("id", "=", before.id)
    .where("deleted_at", "is", null)
    .executeTakeFirst();
  if (updated.numUpdatedRows === BigInt(0)) return undefined;
  await appendAudit(trx, {
    actorId: actor.id,
    action: "alarm_rule.update",
    entity: "alarm_rule",
    entityId: before.id,
    before: auditView(before),
    after: auditView({ ...next, channel: before.channel }),
  });
  await announce(trx);
  return findAlarmRule(trx, before.id);
}

/** Removes a rule from use (its events keep it for their history) with its audit entry; false when already gone. */
export async function deleteAlarmRule(trx: Transaction<Database>, actor: SessionUser, rule: AlarmRuleView): Promise<boolean> {
  const gone = await trx.updateTable("alarm_rules").set({ deleted_at: sql`now()`, enabled: false }).where("id", "=", rule.id).where("deleted_at", "is", null).executeTakeFirst();
  if (gone.numUpdatedRows === BigInt(0)) return false;
  await appendAudit(trx, { actorId: actor.id, action: "alarm_rule.delete", entity: "alarm_rule", entityId: rule.id, before: auditView(rule) });
  await announce(trx);
  return true;
}
