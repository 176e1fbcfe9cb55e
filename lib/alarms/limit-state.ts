import type { LimitSide } from "@/lib/protocol";
import type { AlarmLimits } from "./rule";

/**
 * One trace's progress against a rule's limits. `normal`: inside the limits (armed). `pending`:
 * beyond a limit since `since`, not yet for the minimum duration. `raised`: the alarm is up since
 * `since`. `limit` is the value of the limit crossed; `peak` the most extreme value beyond it since
 * the excursion began.
 */
export interface LimitState {
  phase: "normal" | "pending" | "raised";
  side: LimitSide | null;
  limit: number;
  since: number;
  peak: number;
}

export interface LimitTransition {
  kind: "raise" | "clear";
  side: LimitSide;
  limit: number;
  at: number;
  peak: number;
}

export function restingState(): LimitState {
  return { phase: "normal", side: null, limit: 0, since: 0, peak: 0 };
}

const beyond = (l: AlarmLimits, side: LimitSide, v: number): boolean => (side === "high" ? l.high !== null && v > l.high : l.low !== null && v < l.low);

/** Back inside the limit by the deadband (hysteresis): the condition that clears a raised alarm. */
const clearOf = (l: AlarmLimits, side: LimitSide, v: number): boolean =>
  side === "high" ? l.high === null || v < l.high - l.deadband : l.low === null || v > l.low + l.deadband;

/** The more extreme of two values beyond a limit on `side`. */
export const further = (side: LimitSide, a: number, b: number): number => (side === "high" ? Math.max(a, b) : Math.min(a, b));

/**
 * Advances the state by one sample (value v at time t, ms) and returns the transition it caused,
 * if any. An on-delay with a hysteresis band, the usual alarm logic (ISA-18.2 speaks of alarm
 * on-delay and deadband — from memory): a pending excursion that comes back inside the limit
 * before minDurationMs starts over; a raised alarm clears only past the deadband and then re-arms.
 */
export function stepLimit(s: LimitState, l: AlarmLimits, t: number, v: number): LimitTransition | null {
  if (s.phase === "raised" && s.side) {
    s.peak = further(s.side, v, s.peak);
    if (!clearOf(l, s.side, v)) return null;
    const cleared: LimitTransition = { kind: "clear", side: s.side, limit: s.limit, at: t, peak: s.peak };
    // Armed again; a value already past the other limit starts its excursion on the next sample.
    s.phase = "normal";
    s.side = null;
    return cleared;
  }
  if (s.phase === "pending" && s.side) {
    if (beyond(l, s.side, v)) {
      s.peak = further(s.side, v, s.peak);
      return t - s.since >= l.minDurationMs ? raise(s, s.side, t) : null;
    }
    s.phase = "normal";
    s.side = null;
  }
  return beginExcursion(s, l, t, v);
}

function beginExcursion(s: LimitState, l: AlarmLimits, t: number, v: number): LimitTransition | null {
  let side: LimitSide;
  if (l.high !== null && v > l.high) {
    side = "high";
    s.limit = l.high;
  } else if (l.low !== null && v < l.low) {
    side = "low";
    s.limit = l.low;
  } else return null;
  s.phase = "pending";
  s.side = side;
  s.since = t;
  s.peak = v;
  return l.minDurationMs <= 0 ? raise(s, side, t) : null;
}

function raise(s: LimitState, side: LimitSide, t: number): LimitTransition {
  s.phase = "raised";
  s.since = t;
  return { kind: "raise", side, limit: s.limit, at: t, peak: s.peak };
}
