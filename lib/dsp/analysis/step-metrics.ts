import type { FilterDesign } from "../types";
import { runForm } from "./design-form";
import { dcGainOrNull, peakGainDb } from "./gain";
import { stability } from "./stability";
import { stepResponse } from "./time-response";

/**
 * Step-response metrics of a digital filter, for a unit step applied at t = 0 to a filter at rest;
 * sample k is at time k/fs s. Reference levels and terms follow IEEE Std 181-2011 (transitions,
 * 10 %/90 % reference levels; from memory):
 * - finalValue: the DC gain H(1) from the transfer function (dimensionless), not a simulation tail.
 * - riseTimeS: from the first instant the response reaches 10 % of the final value to the first instant
 *   it reaches 90 % (in the final value's direction); each instant is linearly interpolated between the
 *   two samples around it, and is 0 if sample 0 is already there.
 * - overshootPercent: (peak − final)/|final| × 100, the peak taken in the final value's direction;
 *   0 if the response never passes the final value.
 * - settlingTimeS: (k + 1)/fs for the last sample k outside final ± 2 % of |final|; 0 if none is.
 * A metric is null when undefined: all but finalValue for an unstable design (some |p| ≥ 1); rise,
 * overshoot and settling when DC is blocked — the final value is 0 (a highpass or bandpass) or more than
 * DC_BLOCKED_DB = 20 dB below the passband reference peakGainDb (our choice: an even-order elliptic
 * highpass settles to its −60 dB stopband level, against which "overshoot" would read 10⁵ %) — and
 * when a level is not reached / the band not entered within the simulated length.
 * finalValue is null only when a pole sits at z = 1 (unbounded DC gain).
 * Length: 2·⌈ln(10⁻⁶)/ln r⌉ samples for the largest pole radius r (until r^n < 10⁻⁶, doubled for
 * repeated poles), at least 64 and the FIR length + 1, at most MAX_STEP_SAMPLES.
 */
export interface StepMetrics {
  /** 10 %–90 % rise time in s. */
  riseTimeS: number | null;
  /** Overshoot in % of |final|. */
  overshootPercent: number | null;
  /** 2 % settling time in s. */
  settlingTimeS: number | null;
  /** DC gain H(1), dimensionless. */
  finalValue: number | null;
}

/** Longest simulated step response, in samples. */
export const MAX_STEP_SAMPLES = 1 << 20;
/** Lower/upper reference levels for rise time and the settling band, as fractions of |final| (IEEE 181 practice). */
export const RISE_LOW = 0.1;
export const RISE_HIGH = 0.9;
export const SETTLING_BAND = 0.02;

const DECAY = 1e-6;
const MIN_STEP_SAMPLES = 64;
/** DC this far below the passband reference (dB) counts as blocked: rise, overshoot and settling are null. */
export const DC_BLOCKED_DB = 20;

/** Step-response metrics of a design; definitions and units in the header above. */
export function stepMetrics(design: FilterDesign): StepMetrics {
  const form = runForm(design);
  const { stable, maxPoleRadius } = stability(design);
  const none = { riseTimeS: null, overshootPercent: null, settlingTimeS: null };
  const finalValue = dcGainOrNull(design);
  if (!stable || finalValue === null) return { ...none, finalValue };
  if (Math.abs(finalValue) <= 10 ** ((peakGainDb(design) - DC_BLOCKED_DB) / 20)) return { ...none, finalValue };

  const firLength = form.reduce((n, part) => n + (part.kind === "taps" ? part.taps.length : 0), 0);
  const n = simulationLength(maxPoleRadius, firLength);
  const y = stepResponse(design, n);
  const fs = design.sampleRateHz;
  const dir = Math.sign(finalValue);
  const target = Math.abs(finalValue);

  const t10 = firstReach(y, dir, RISE_LOW * target);
  const t90 = firstReach(y, dir, RISE_HIGH * target);
  let peak = -Infinity;
  let lastOutside = -1;
  y.forEach((v, k) => {
    peak = Math.max(peak, dir * v);
    if (Math.abs(v - finalValue) > SETTLING_BAND * target) lastOutside = k;
  });
  return {
    riseTimeS: t10 === null || t90 === null ? null : (t90 - t10) / fs,
    overshootPercent: Math.max(0, ((peak - target) / target) * 100),
    settlingTimeS: lastOutside === n - 1 ? null : (lastOutside + 1) / fs,
    finalValue,
  };
}

function simulationLength(maxPoleRadius: number, firLength: number): number {
  const decay = maxPoleRadius > 0 ? 2 * Math.ceil(Math.log(DECAY) / Math.log(maxPoleRadius)) : 0;
  return Math.min(Math.max(decay + firLength, MIN_STEP_SAMPLES, firLength + 1), MAX_STEP_SAMPLES);
}

/** Fractional sample index at which dir·y first reaches level (linear interpolation), or null. */
function firstReach(y: Float64Array, dir: number, level: number): number | null {
  for (let k = 0; k < y.length; k++) {
    const v = dir * y[k];
    if (v < level) continue;
    if (k === 0) return 0;
    const prev = dir * y[k - 1];
    return k - 1 + (level - prev) / (v - prev);
  }
  return null;
}
