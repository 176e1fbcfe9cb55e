import { polyMul } from "../poly";
import type { FilterDesign } from "../types";

/** One running part: SOS rows [b0, b1, b2, 1, a1, a2], FIR taps, or a direct form b/a (a[0] = 1). */
export type RunPart = { kind: "sos"; sos: number[][] } | { kind: "taps"; taps: number[] } | { kind: "ba"; b: number[]; a: number[] };

/** A part fixed point can quantize: sections or taps (direct forms are factored into sections first). */
export type SectionPart = Extract<RunPart, { kind: "sos" | "taps" }>;

/** A design reduced to what runs: its parts in order, a cascade (one part for a single design, one per stage for a chain). */
export type RunForm = RunPart[];

/**
 * The run form of a design, after checking what every analysis relies on: a finite sample rate
 * above 0 Hz; for a single design exactly one of sos, taps and ba, for a chain at least one stage and each
 * stage with exactly one of them; six finite numbers per SOS row with a0 = 1 and a non-zero numerator,
 * finite taps not all zero, a direct form with finite b not all zero and finite a with a[0] = 1.
 * Throws with the allowed range otherwise.
 */
export function runForm(design: FilterDesign): RunForm {
  const fs = design.sampleRateHz;
  if (!Number.isFinite(fs) || fs <= 0) {
    throw new Error(`sampleRateHz must be a finite number > 0 Hz (got ${fs})`);
  }
  if (design.stages === undefined) return [runPart(design, "")];
  if (design.sos !== undefined || design.taps !== undefined || design.ba !== undefined) {
    throw new Error("a chain's design holds its stages only, not sos, taps or ba of its own");
  }
  if (design.stages.length === 0) throw new Error("a chain's design must have at least one stage");
  return design.stages.map((stage) => {
    if (stage.sampleRateHz !== fs) {
      throw new Error(`stage ${stage.stage + 1} runs at ${stage.sampleRateHz} Hz, the chain at ${fs} Hz`);
    }
    return runPart(stage, `stage ${stage.stage + 1}: `);
  });
}

/** One part checked as runForm describes; `where` prefixes each message (e.g. "stage 2: "). */
export function runPart(design: Pick<FilterDesign, "sos" | "taps" | "ba">, where: string): RunPart {
  const forms = [design.sos, design.taps, design.ba].filter((f) => f !== undefined).length;
  if (forms !== 1) throw new Error(`${where}a FilterDesign must have exactly one of sos, taps and ba`);
  if (design.ba) return directFormPart(design.ba.b, design.ba.a, where);
  if (design.sos) {
    if (design.sos.length === 0) throw new Error(`${where}sos must have at least one section`);
    design.sos.forEach((row, i) => {
      if (row.length !== 6 || row.some((v) => !Number.isFinite(v))) {
        throw new Error(`${where}sos row ${i} must hold 6 finite numbers [b0, b1, b2, a0, a1, a2]`);
      }
      if (row[3] !== 1) throw new Error(`${where}sos row ${i} must have a0 = 1 (got ${row[3]})`);
      if (row[0] === 0 && row[1] === 0 && row[2] === 0) {
        throw new Error(`${where}sos row ${i} has an all-zero numerator, so the filter output is identically zero`);
      }
    });
    return { kind: "sos", sos: design.sos };
  }
  const taps = design.taps ?? [];
  if (taps.length === 0 || taps.some((v) => !Number.isFinite(v)) || taps.every((v) => v === 0)) {
    throw new Error(`${where}taps must hold at least 1 finite number, at least one of them non-zero`);
  }
  return { kind: "taps", taps };
}

/** A direct-form part checked as runForm describes. */
function directFormPart(b: number[], a: number[], where: string): RunPart {
  if (b.length === 0 || b.some((v) => !Number.isFinite(v)) || b.every((v) => v === 0)) {
    throw new Error(`${where}ba.b must hold at least 1 finite number, at least one of them non-zero`);
  }
  if (a.length === 0 || a.some((v) => !Number.isFinite(v)) || a[0] !== 1) {
    throw new Error(`${where}ba.a must hold finite numbers with a[0] = 1 (got a[0] = ${a[0]})`);
  }
  return { kind: "ba", b, a };
}

/**
 * A run form as one b/a pair in ascending powers of z⁻¹: the products of every section's numerator
 * and denominator, of every FIR part's taps and of every direct form's b and a (a cascade's
 * polynomials multiply).
 */
export function formPolynomials(form: RunForm): { b: number[]; a: number[] } {
  let b = [1];
  let a = [1];
  for (const part of form) {
    if (part.kind === "taps") {
      b = polyMul(b, part.taps);
      continue;
    }
    if (part.kind === "ba") {
      b = polyMul(b, part.b);
      a = polyMul(a, part.a);
      continue;
    }
    for (const row of part.sos) {
      b = polyMul(b, row.slice(0, 3));
      a = polyMul(a, row.slice(3, 6));
    }
  }
  return { b, a };
}

/** Normalised angular frequency ω = 2π·f/fs in rad/sample for f in Hz (common practice). */
export function radPerSample(freqHz: number, sampleRateHz: number): number {
  if (!Number.isFinite(freqHz) || freqHz < 0) {
    throw new Error(`frequencies must be finite numbers ≥ 0 Hz (got ${freqHz})`);
  }
  return (2 * Math.PI * freqHz) / sampleRateHz;
}
