import { cAbs } from "../complex";
import type { FilterDesign } from "../types";
import { radPerSample, runForm, type RunForm } from "./design-form";
import { transferAt } from "./evaluate";
import { linearGrid, logGrid } from "./grid";
import { magnitudeToDb } from "./units";

/**
 * DC gain H(z = 1) (dimensionless, signed): Π (b0+b1+b2)/(1+a1+a2) over sections, or Σ taps.
 * Throws when a pole sits at z = 1 (an integrator), where the DC gain is unbounded.
 */
export function dcGain(design: FilterDesign): number {
  const form = runForm(design);
  if (form.kind === "taps") return form.taps.reduce((s, t) => s + t, 0);
  let g = 1;
  form.sos.forEach((row, i) => {
    const den = 1 + row[4] + row[5];
    if (den === 0) throw new Error(`dcGain: section ${i} has a pole at z = 1, so the DC gain is unbounded`);
    g *= (row[0] + row[1] + row[2]) / den;
  });
  return g;
}

/** Points of the dense search grid (linear and log each) used for the passband reference and cutoffs. */
export const SEARCH_GRID_POINTS = 8192;

/** The dense search grid in Hz over [0, fs/2]: linear ∪ log (log catches low-frequency features), sorted. */
export function searchGrid(sampleRateHz: number): number[] {
  const all = [...linearGrid(sampleRateHz, SEARCH_GRID_POINTS), ...logGrid(sampleRateHz, SEARCH_GRID_POINTS)];
  return all.sort((a, b) => a - b);
}

/** |H| in dB (floored at −400 dB) of a run form at f Hz. */
export function magnitudeDbAt(form: RunForm, freqHz: number, sampleRateHz: number): number {
  return magnitudeToDb(cAbs(transferAt(form, radPerSample(freqHz, sampleRateHz))));
}

/** Relative width at which the golden-section refinement of the passband peak stops. */
const PEAK_TOLERANCE = 1e-9;
const INV_PHI = (Math.sqrt(5) - 1) / 2;

/**
 * Passband reference in dB: the maximum of |H| over [0, fs/2], taken on the search grid and refined by
 * golden-section search between the neighbours of the best grid point (Press et al., Numerical Recipes §10.2).
 */
export function peakGainDb(design: FilterDesign): number {
  const form = runForm(design);
  const fs = design.sampleRateHz;
  const grid = searchGrid(fs);
  const mags = grid.map((f) => magnitudeDbAt(form, f, fs));
  let best = 0;
  mags.forEach((m, i) => {
    if (m > mags[best]) best = i;
  });
  let lo = grid[Math.max(best - 1, 0)];
  let hi = grid[Math.min(best + 1, grid.length - 1)];
  let peak = mags[best];
  while (hi - lo > PEAK_TOLERANCE * Math.max(hi, fs * PEAK_TOLERANCE)) {
    const c = hi - INV_PHI * (hi - lo);
    const d = lo + INV_PHI * (hi - lo);
    const mc = magnitudeDbAt(form, c, fs);
    const md = magnitudeDbAt(form, d, fs);
    peak = Math.max(peak, mc, md);
    if (mc > md) hi = d;
    else lo = c;
  }
  return peak;
}

/** Attenuation in dB below the passband reference (peakGainDb) at each f in Hz; positive means attenuated. */
export function attenuationDb(design: FilterDesign, freqsHz: readonly number[]): number[] {
  const form = runForm(design);
  const reference = peakGainDb(design);
  return freqsHz.map((f) => reference - magnitudeDbAt(form, f, design.sampleRateHz));
}
