import { randomUUID } from "node:crypto";
import type { Db } from "@/db/client";
import { findAlarmEvent, listRaisedRecords, type AlarmEventRecord } from "@/db/queries/alarm-events";
import { listAlarmRules, type AlarmRuleView } from "@/db/queries/alarm-rules";
import { closeTracker, createTracker, limitsChanged, resumeRaised, trackBlock, type AlarmTransition, type RuleTracker } from "@/lib/alarms";
import type { AlarmEventView, AlarmKind, ControlMessage, SampleBatch } from "@/lib/protocol";
import type { Clock, Logger } from "../clock";
import type { EventStore } from "./event-store";
import { errorMessage } from "@/lib/errors";

/** What browsers are shown of an event beyond what is written for it. */
type About = Pick<AlarmEventView, "ruleName" | "channel" | "unit" | "acknowledgedAt" | "acknowledgedBy" | "comment">;

const aboutOf = (v: AlarmEventView): About => ({
  ruleName: v.ruleName,
  channel: v.channel,
  unit: v.unit,
  acknowledgedAt: v.acknowledgedAt,
  acknowledgedBy: v.acknowledgedBy,
  comment: v.comment,
});

/** An alarm the engine holds open. */
interface OpenAlarm {
  record: AlarmEventRecord;
  about: About;
}

/** A rule as loaded, with its tracker on the live stream. */
interface Tracked {
  rule: AlarmRuleView;
  tr: RuleTracker;
}

export interface AlarmEngineDeps {
  db: Db;
  store: EventStore;
  /** The production revision running on a channel now (a revision id), or null. */
  productionRevision: (path: string) => string | null;
  /** Sends a message to every connected browser. */
  broadcast: (message: ControlMessage) => void;
  clock: Clock;
  logger: Logger;
}

export interface AlarmEngine {
  /** Runs the channel's rules over an accepted batch, with the production filter's output (null without one). */
  evaluate(path: string, batch: SampleBatch, production: Float64Array | null): void;
  /** Loads the rules again (after a change) and carries every still-valid tracker on. */
  reload(): Promise<void>;
  /** Pushes the stored state of an event (after an acknowledgement) to every browser. */
  announce(id: string): Promise<void>;
  /** How many rules are evaluated. */
  ruleCount(): number;
}

const keyOf = (ruleId: number, kind: AlarmKind) => `${ruleId}:${kind}`;
const iso = (ms: number) => new Date(ms).toISOString();

/**
 * Evaluates alarm rules on the live stream: every accepted sample of a channel goes through its
 * rules' trackers (lib/alarms), raised and cleared alarms are written through the event store
 * (buffered while the database is down) and pushed to every browser at once. Rules are loaded at
 * start and on every change; alarms raised before a restart are carried on, not raised twice.
 */
export async function createAlarmEngine(deps: AlarmEngineDeps): Promise<AlarmEngine> {
  /** Channel path → its rules' trackers. */
  const trackers = new Map<string, Tracked[]>();
  const open = new Map<string, OpenAlarm>();
  let lastFailureLog = -Infinity;

  function apply(rule: AlarmRuleView, path: string, t: AlarmTransition): void {
    const key = keyOf(t.ruleId, t.kind);
    if (t.change === "raise") {
      const revision = t.kind === "masked" || rule.signal === "filtered" ? deps.productionRevision(path) : null;
      const held: OpenAlarm = {
        record: {
          id: randomUUID(),
          ruleId: rule.id,
          kind: t.kind,
          severity: rule.severity,
          signal: rule.signal,
          side: t.side,
          limit: t.limit,
          state: "raised",
          raisedAt: t.at,
          clearedAt: null,
          peak: t.peak,
          revisionId: revision === null ? null : Number(revision),
        },
        about: { ruleName: rule.name, channel: path, unit: rule.unit, acknowledgedAt: null, acknowledgedBy: null, comment: null },
      };
      open.set(key, held);
      publish(held);
      return;
    }
    const held = open.get(key);
    if (!held) return;
    open.delete(key);
    publish({ ...held, record: { ...held.record, state: "cleared", clearedAt: t.at, peak: t.peak } });
  }

  function publish({ record, about }: OpenAlarm): void {
    deps.store.put(record);
    deps.broadcast({ type: "alarm", v: 1, event: { ...record, ...about, raisedAt: iso(record.raisedAt), clearedAt: record.clearedAt === null ? null : iso(record.clearedAt) } });
  }

  function emitter(rule: AlarmRuleView, path: string) {
    return (t: AlarmTransition) => apply(rule, path, t);
  }

  /** Puts a new rule list in place: trackers of unchanged rules carry on; removed or re-limited ones close what they hold. */
  function install(next: AlarmRuleView[]): void {
    const now = deps.clock.now();
    const byId = new Map(next.map((r) => [r.id, r]));
    const kept = new Map<number, RuleTracker>();
    for (const [path, list] of trackers) {
      for (const { rule: old, tr } of list) {
        const rule = byId.get(old.id);
        if (!rule || limitsChanged(old, rule)) closeTracker(tr, now, emitter(old, path));
        else kept.set(rule.id, tr);
      }
    }
    trackers.clear();
    for (const rule of next) {
      const tr = kept.get(rule.id) ?? createTracker(rule);
      tr.rule = rule;
      trackers.set(rule.channel, [...(trackers.get(rule.channel) ?? []), { rule, tr }]);
    }
  }

  function find(ruleId: number): Tracked | undefined {
    for (const list of trackers.values()) for (const t of list) if (t.rule.id === ruleId) return t;
    return undefined;
  }

  /** Carries on the alarms the database holds raised for these rules (a restart). */
  async function resume(): Promise<void> {
    for (const record of await listRaisedRecords(deps.db)) {
      const tracked = find(record.ruleId);
      const view = tracked && (await findAlarmEvent(deps.db, record.id));
      if (!tracked || !view) continue;
      resumeRaised(tracked.tr, { kind: record.kind, side: record.side, limit: record.limit, since: record.raisedAt, peak: record.peak });
      open.set(keyOf(record.ruleId, record.kind), { record, about: aboutOf(view) });
    }
  }

  const count = () => [...trackers.values()].reduce((n, list) => n + list.length, 0);

  install(await listAlarmRules(deps.db, { enabledOnly: true }));
  await resume();
  deps.logger.info(`alarms: ${count()} rules on ${trackers.size} channels, ${open.size} alarms carried on`);

  return {
    evaluate(path, batch, production) {
      const list = trackers.get(path);
      if (!list) return;
      const block = { t0: batch.t0, dtMs: 1000 / batch.sampleRateHz, raw: batch.values, filtered: production };
      for (const { rule, tr } of list) {
        try {
          trackBlock(tr, block, emitter(rule, path));
        } catch (err) {
          const now = deps.clock.now();
          if (now - lastFailureLog < 60_000) continue;
          lastFailureLog = now;
          deps.logger.warn(`alarm rule ${rule.id} on ${path} failed: ${errorMessage(err)}`);
        }
      }
    },
    async reload() {
      install(await listAlarmRules(deps.db, { enabledOnly: true }));
      deps.logger.info(`alarms: rules reloaded (${count()})`);
    },
    async announce(id) {
      const view = await findAlarmEvent(deps.db, id);
      if (!view) return;
      for (const held of open.values()) if (held.record.id === id) held.about = aboutOf(view);
      deps.broadcast({ type: "alarm", v: 1, event: view });
    },
    ruleCount: count,
  };
}
