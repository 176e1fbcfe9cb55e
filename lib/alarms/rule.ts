import type { AlarmSeverity, AlarmSignal } from "@/lib/protocol";

/**
 * The limits of a rule, in the channel's unit. An excursion starts when the value goes above
 * `high` (or below `low`); it raises once it has lasted `minDurationMs`; it clears when the value
 * is back inside the limit by `deadband` (hysteresis).
 */
export interface AlarmLimits {
  high: number | null;
  low: number | null;
  deadband: number;
  minDurationMs: number;
}

export interface AlarmRule extends AlarmLimits {
  id: number;
  channel: string;
  name: string;
  signal: AlarmSignal;
  severity: AlarmSeverity;
  enabled: boolean;
}

/** Longest minimum duration a rule may ask for (one hour), ms. */
export const MAX_MIN_DURATION_MS = 3_600_000;

/** What is wrong with a set of limits, as `{path, message}` pairs; empty when they can be evaluated. */
export function limitProblems(l: AlarmLimits): { path: string; message: string }[] {
  const problems: { path: string; message: string }[] = [];
  for (const side of ["high", "low"] as const) {
    const v = l[side];
    if (v !== null && !Number.isFinite(v)) problems.push({ path: side, message: `The ${side} limit must be a number.` });
  }
  if (problems.length) return problems;
  if (l.high === null && l.low === null) problems.push({ path: "high", message: "Give a high limit, a low limit or both." });
  if (l.high !== null && l.low !== null && !(l.low < l.high)) {
    problems.push({ path: "low", message: `The low limit (${l.low}) must be below the high limit (${l.high}).` });
  }
  if (!(Number.isFinite(l.deadband) && l.deadband >= 0)) problems.push({ path: "deadband", message: "The deadband must be 0 or more." });
  if (l.high !== null && l.low !== null && l.deadband >= l.high - l.low) {
    problems.push({
      path: "deadband",
      message: `The deadband (${l.deadband}) must be smaller than the gap between the limits (${l.high - l.low}), or clearing one limit would cross the other.`,
    });
  }
  if (!Number.isInteger(l.minDurationMs) || l.minDurationMs < 0 || l.minDurationMs > MAX_MIN_DURATION_MS) {
    problems.push({ path: "minDurationMs", message: `The minimum duration must be a whole number of ms from 0 to ${MAX_MIN_DURATION_MS}.` });
  }
  return problems;
}
