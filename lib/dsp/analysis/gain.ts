import { cAbs } from "../complex";
import { directFormDcGain } from "../dc-gain";
import type { FilterDesign } from "../types";
import { radPerSample, runForm, type RunForm } from "./design-form";
import { transferAt } from "./evaluate";
import { linearGrid, logGrid } from "./grid";
import { magnitudeToDb } from "./units";

/**
 * DC gain H(z = 1) (dimensionless, signed): Π (b0+b1+b2)/(1+a1+a2) over sections, Σ taps of each FIR
 * part and Σb/Σa of each direct form (a chain multiplies its stages).
 * Throws when a pole sits at z = 1 (an integrator), where the DC gain is unbounded.
 */
export function dcGain(design: FilterDesign): number {
  const g = dcGainOrNull(design);
  if (g === null) throw new Error("dcGain: a section has a pole at z = 1 (1 + a1 + a2 = 0), so the DC gain is unbounded");
  return g;
}

/** dcGain, or null when a pole sits at z = 1 (1 + a1 + a2 = 0 in some section, or Σa = 0). */
export function dcGainOrNull(design: FilterDesign): number | null {
  let g = 1;
  for (const part of runForm(design)) {
    if (part.kind === "taps") {
      g *= part.taps.reduce((s, t) => s + t, 0);
      continue;
    }
    if (part.kind === "ba") {
      const gain = directFormDcGain(part.b, part.a);
      if (gain === null) return null;
      g *= gain;
      continue;
    }
    for (const [b0, b1, b2, , a1, a2] of part.sos) {
      const den = 1 + a1 + a2;
      if (den === 0) return null;
      g *= (b0 + b1 + b2) / den;
    }
  }
  return g;
}

/** Points of the dense search grid (linear and log each) used for the passband reference and cutoffs. */
export const SEARCH_GRID_POINTS = 8192;

/** |H| in dB (floored at −400 dB) of a run form at f Hz. */
export function magnitudeDbAt(form: RunForm, freqHz: number, sampleRateHz: number): number {
  return magnitudeToDb(cAbs(transferAt(form, radPerSample(freqHz, sampleRateHz))));
}

/** The dense search grid in Hz over [0, fs/2] (linear ∪ log, so low-frequency features are caught), sorted, with |H| in dB. */
export function searchGrid(form: RunForm, sampleRateHz: number): { freqsHz: number[]; magnitudeDb: number[] } {
  const freqsHz = [...linearGrid(sampleRateHz, SEARCH_GRID_POINTS), ...logGrid(sampleRateHz, SEARCH_GRID_POINTS)];
  freqsHz.sort((a, b) => a - b);
  return { freqsHz, magnitudeDb: freqsHz.map((f) => magnitudeDbAt(form, f, sampleRateHz)) };
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
  return referenceDb(form, design.sampleRateHz, searchGrid(form, design.sampleRateHz));
}

/** peakGainDb from an already evaluated search grid. */
export function referenceDb(form: RunForm, sampleRateHz: number, grid: ReturnType<typeof searchGrid>): number {
  const { freqsHz, magnitudeDb } = grid;
  let best = 0;
  magnitudeDb.forEach((m, i) => {
    if (m > magnitudeDb[best]) best = i;
  });
  let lo = freqsHz[Math.max(best - 1, 0)];
  let hi = freqsHz[Math.min(best + 1, freqsHz.length - 1)];
  let peak = magnitudeDb[best];
  while (hi - lo > PEAK_TOLERANCE * Math.max(hi, sampleRateHz * PEAK_TOLERANCE)) {
    const c = hi - INV_PHI * (hi - lo);
    const d = lo + INV_PHI * (hi - lo);
    const mc = magnitudeDbAt(form, c, sampleRateHz);
    const md = magnitudeDbAt(form, d, sampleRateHz);
    peak = Math.max(peak, mc, md);
    if (mc > md) hi = d;
    else lo = c;
  }
  return peak;
}

/**
 * Attenuation in dB below the passband reference (peakGainDb) at each f in Hz; positive means attenuated.
 * A caller that judges the same design again and again passes the reference it computed once.
 */
export function attenuationDb(design: FilterDesign, freqsHz: readonly number[], reference = peakGainDb(design)): number[] {
  const form = runForm(design);
  return freqsHz.map((f) => reference - magnitudeDbAt(form, f, design.sampleRateHz));
}
