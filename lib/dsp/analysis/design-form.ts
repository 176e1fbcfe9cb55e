import type { FilterDesign } from "../types";

/** A design reduced to the one form it runs in: SOS rows [b0, b1, b2, 1, a1, a2] or FIR taps. */
export type RunForm = { kind: "sos"; sos: number[][] } | { kind: "taps"; taps: number[] };

/**
 * The run form of a design, after checking what every analysis relies on: a finite sample rate
 * above 0 Hz, exactly one of sos and taps, six finite numbers per SOS row with a0 = 1 and a non-zero
 * numerator, finite taps not all zero. Throws with the allowed range otherwise.
 */
export function runForm(design: FilterDesign): RunForm {
  const fs = design.sampleRateHz;
  if (!Number.isFinite(fs) || fs <= 0) {
    throw new Error(`sampleRateHz must be a finite number > 0 Hz (got ${fs})`);
  }
  const hasSos = design.sos !== undefined;
  const hasTaps = design.taps !== undefined;
  if (hasSos === hasTaps) throw new Error("a FilterDesign must have exactly one of sos and taps");
  if (design.sos) {
    if (design.sos.length === 0) throw new Error("sos must have at least one section");
    design.sos.forEach((row, i) => {
      if (row.length !== 6 || row.some((v) => !Number.isFinite(v))) {
        throw new Error(`sos row ${i} must hold 6 finite numbers [b0, b1, b2, a0, a1, a2]`);
      }
      if (row[3] !== 1) throw new Error(`sos row ${i} must have a0 = 1 (got ${row[3]})`);
      if (row[0] === 0 && row[1] === 0 && row[2] === 0) {
        throw new Error(`sos row ${i} has an all-zero numerator, so the filter output is identically zero`);
      }
    });
    return { kind: "sos", sos: design.sos };
  }
  const taps = design.taps ?? [];
  if (taps.length === 0 || taps.some((v) => !Number.isFinite(v)) || taps.every((v) => v === 0)) {
    throw new Error("taps must be finite numbers, at least one of them non-zero");
  }
  return { kind: "taps", taps };
}

/** Normalised angular frequency ω = 2π·f/fs in rad/sample for f in Hz (common practice). */
export function radPerSample(freqHz: number, sampleRateHz: number): number {
  if (!Number.isFinite(freqHz) || freqHz < 0) {
    throw new Error(`frequencies must be finite numbers ≥ 0 Hz (got ${freqHz})`);
  }
  return (2 * Math.PI * freqHz) / sampleRateHz;
}
