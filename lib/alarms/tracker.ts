import { further, restingState, stepLimit, type LimitState, type LimitTransition } from "./limit-state";
import type { AlarmKind, LimitSide } from "@/lib/protocol";
import type { AlarmRule } from "./rule";

/** A change of one rule's alarm: raised or cleared at `at` (ms), with the limit crossed and the peak beyond it so far. */
export interface AlarmTransition {
  ruleId: number;
  kind: AlarmKind;
  change: "raise" | "clear";
  side: LimitSide;
  limit: number;
  at: number;
  peak: number;
}

/**
 * How far apart a raw and a filtered raise may be and still count as one excursion (ms): the
 * filter's delay makes the filtered crossing come later, and near the end of an excursion the raw
 * signal may cross again on noise the filter removes. Longer than the group delay of the low-pass
 * filters the bench designs for alarm-bearing channels (tens of ms).
 */
export const MASK_GRACE_MS = 1000;

/** A raw excursion of a filtered rule being watched for whether the filtered signal follows it. */
interface MaskWatch {
  side: LimitSide;
  limit: number;
  start: number;
  /** The raw peak beyond the limit. */
  peak: number;
  filteredSeen: boolean;
  rawClearedAt: number | null;
  /** Already raised as masked. */
  reported: boolean;
}

/** One rule's evaluation state on its channel. */
export interface RuleTracker {
  rule: AlarmRule;
  /** The rule's own trace: the filtered signal, or raw for a raw rule. */
  main: LimitState;
  /** For filtered rules: the same limits on the raw signal. */
  shadow: LimitState;
  watch: MaskWatch | null;
  /** When the rule's own trace was last seen raised on each side (ms). */
  lastRaised: Record<LimitSide, number>;
}

/** Consecutive samples of a channel: raw, and the production filter's output beside it (null when there is none: the device sends raw). */
export interface SampleBlock {
  /** Time of the first sample, ms. */
  t0: number;
  /** Sample interval, ms. */
  dtMs: number;
  raw: ArrayLike<number>;
  filtered: ArrayLike<number> | null;
}

export type Emit = (t: AlarmTransition) => void;

export function createTracker(rule: AlarmRule): RuleTracker {
  return { rule, main: restingState(), shadow: restingState(), watch: null, lastRaised: { high: -Infinity, low: -Infinity } };
}

/**
 * Runs one rule over a block, sample by sample, and emits every transition. For a filtered rule on
 * a channel with a production filter it also runs the limits on raw: when raw raises and the
 * filtered signal is not raised on the same side within MASK_GRACE_MS either way (before: the
 * tail of an excursion it already caught; after: its delay), a `masked` alarm is raised (the filter
 * hid the excursion), dated from the raw raise, and cleared when raw clears.
 */
export function trackBlock(tr: RuleTracker, block: SampleBlock, emit: Emit): void {
  const { rule } = tr;
  const { raw, filtered, t0, dtMs } = block;
  const shadowed = rule.signal === "filtered" && filtered !== null;
  for (let i = 0; i < raw.length; i++) {
    const t = t0 + i * dtMs;
    const value = rule.signal === "raw" || filtered === null ? raw[i] : filtered[i];
    const main = stepLimit(tr.main, rule, t, value);
    if (main) emit(transition(rule.id, "limit", main));
    if (tr.main.phase === "raised" && tr.main.side) tr.lastRaised[tr.main.side] = t;
    if (shadowed) watchRaw(tr, stepLimit(tr.shadow, rule, t, raw[i]), t, emit);
  }
}

function watchRaw(tr: RuleTracker, raw: LimitTransition | null, t: number, emit: Emit): void {
  if (raw?.kind === "raise") {
    if (tr.watch) {
      // Raw crossed again before the check was settled: the same excursion, still being watched.
      tr.watch.rawClearedAt = null;
    } else {
      const seen = raw.at - tr.lastRaised[raw.side] <= MASK_GRACE_MS;
      tr.watch = { side: raw.side, limit: raw.limit, start: raw.at, peak: raw.peak, filteredSeen: seen, rawClearedAt: null, reported: false };
    }
  }
  const w = tr.watch;
  if (!w) return;
  if (tr.main.phase === "raised" && tr.main.side === w.side) w.filteredSeen = true;
  if (w.rawClearedAt === null && tr.shadow.phase === "raised" && tr.shadow.side === w.side) w.peak = further(w.side, tr.shadow.peak, w.peak);
  if (raw?.kind === "clear" && w.rawClearedAt === null) {
    w.rawClearedAt = raw.at;
    w.peak = further(w.side, raw.peak, w.peak);
    if (w.reported) {
      emit(masked(tr, w, "clear", raw.at));
      tr.watch = null;
      return;
    }
  }
  if (!w.reported && t - w.start >= MASK_GRACE_MS) decide(tr, w, emit);
}

/** Settles a watch at the end of the grace time: masked when the filtered signal never raised on its side. */
function decide(tr: RuleTracker, w: MaskWatch, emit: Emit): void {
  if (w.filteredSeen) {
    tr.watch = null;
    return;
  }
  emit(masked(tr, w, "raise", w.start));
  w.reported = true;
  if (w.rawClearedAt !== null) {
    emit(masked(tr, w, "clear", w.rawClearedAt));
    tr.watch = null;
  }
}

function masked(tr: RuleTracker, w: MaskWatch, change: "raise" | "clear", at: number): AlarmTransition {
  return { ruleId: tr.rule.id, kind: "masked", change, side: w.side, limit: w.limit, at, peak: w.peak };
}

/** Ends whatever the tracker holds raised at time t (the rule was changed, disabled or removed). */
export function closeTracker(tr: RuleTracker, t: number, emit: Emit): void {
  if (tr.main.phase === "raised" && tr.main.side) emit(transition(tr.rule.id, "limit", { kind: "clear", side: tr.main.side, limit: tr.main.limit, at: t, peak: tr.main.peak }));
  if (tr.watch?.reported) emit(masked(tr, tr.watch, "clear", t));
  tr.main = restingState();
  tr.shadow = restingState();
  tr.watch = null;
  tr.lastRaised = { high: -Infinity, low: -Infinity };
}

/**
 * Picks up an alarm that was raised before a restart: the tracker continues it (and clears it when
 * the signal is back inside) instead of raising it a second time.
 */
export function resumeRaised(tr: RuleTracker, a: { kind: AlarmKind; side: LimitSide; limit: number; since: number; peak: number }): void {
  const { kind, side, limit, since, peak } = a;
  if (kind === "limit") {
    tr.main = { phase: "raised", side, limit, since, peak };
    return;
  }
  tr.shadow = { phase: "raised", side, limit, since, peak };
  tr.watch = { side, limit, start: since, peak, filteredSeen: false, rawClearedAt: null, reported: true };
}

/** Whether a change of rule needs a fresh evaluation (anything that decides when it raises or clears). */
export function limitsChanged(a: AlarmRule, b: AlarmRule): boolean {
  return a.signal !== b.signal || a.high !== b.high || a.low !== b.low || a.deadband !== b.deadband || a.minDurationMs !== b.minDurationMs || a.channel !== b.channel;
}

function transition(ruleId: number, kind: AlarmKind, t: LimitTransition): AlarmTransition {
  return { ruleId, kind, change: t.kind, side: t.side, limit: t.limit, at: t.at, peak: t.peak };
}
