import type { FilterDesign } from "../types";
import { runForm } from "./design-form";
import { magnitudeDbAt, referenceDb, searchGrid } from "./gain";

/** Half-power drop in dB: 10·log10(2) = 3.0103 dB (the "−3 dB" point, common practice). */
export const HALF_POWER_DB = 10 * Math.log10(2);

/** Relative width in frequency at which bisection of a crossing stops. */
export const CUTOFF_TOLERANCE = 1e-9;

export interface CutoffOptions {
  /** Drop below the passband reference in dB, > 0; default HALF_POWER_DB (3.0103 dB). */
  dropDb?: number;
}

/**
 * Frequencies in Hz (ascending) where |H| crosses `dropDb` below the passband reference (peakGainDb,
 * the maximum of |H| over [0, fs/2]). Crossings are found as sign changes on the dense search grid
 * (8192 linear ∪ 8192 log points) and refined by bisection to 1e-9 relative. Two crossings closer than
 * one grid step (a notch far narrower than fs/16384) can be missed.
 */
export function cutoffPoints(design: FilterDesign, opts: CutoffOptions = {}): number[] {
  const dropDb = opts.dropDb ?? HALF_POWER_DB;
  if (!Number.isFinite(dropDb) || dropDb <= 0) throw new Error(`dropDb must be a finite number > 0 dB (got ${dropDb})`);
  const form = runForm(design);
  const fs = design.sampleRateHz;
  const grid = searchGrid(form, fs);
  const level = referenceDb(form, fs, grid) - dropDb;
  const above = (f: number) => magnitudeDbAt(form, f, fs) >= level;
  const states = grid.magnitudeDb.map((m) => m >= level);
  const crossings: number[] = [];
  for (let i = 1; i < states.length; i++) {
    if (states[i] === states[i - 1]) continue;
    let lo = grid.freqsHz[i - 1];
    let hi = grid.freqsHz[i];
    while (hi - lo > CUTOFF_TOLERANCE * hi) {
      const mid = (lo + hi) / 2;
      if (above(mid) === states[i - 1]) lo = mid;
      else hi = mid;
    }
    crossings.push((lo + hi) / 2);
  }
  return crossings;
}
