import { cAbs } from "../complex";
import type { Complex } from "../types";
import { magnitudeToDb } from "../analysis/units";

/** Points of the linear grid over [0, π] rad/sample on which responses are compared. */
export const DEVIATION_GRID_POINTS = 8192;

/** Reference levels more than this far below the reference peak are ignored (dB). */
export const DEVIATION_FLOOR_DB = -100;

/**
 * Worst |ΔdB| between two magnitude responses, each given as ω (rad/sample) → H(e^{jω}), over
 * DEVIATION_GRID_POINTS evenly spaced ω in [0, π], ignoring points where the reference is more
 * than 100 dB below its own peak (deep stopband, where both are noise-level). Common practice.
 */
export function maxDeviationDb(reference: (omega: number) => Complex, candidate: (omega: number) => Complex): number {
  const omegas = Array.from({ length: DEVIATION_GRID_POINTS }, (_, i) => (Math.PI * i) / (DEVIATION_GRID_POINTS - 1));
  const ref = omegas.map((w) => magnitudeToDb(cAbs(reference(w))));
  const cand = omegas.map((w) => {
    const m = cAbs(candidate(w));
    return Number.isFinite(m) ? magnitudeToDb(m) : Infinity;
  });
  const floor = Math.max(...ref) + DEVIATION_FLOOR_DB;
  return ref.reduce((worst, r, i) => (r < floor ? worst : Math.max(worst, Math.abs(cand[i] - r))), 0);
}
