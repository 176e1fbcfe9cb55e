import { designFilter, quantizeDesign, type FilterDesign, type FilterSpec, type QuantFormat, type QuantizedDesign } from "@/lib/dsp";
import { analyseDesign, type AnalysisSummary } from "./analysis";

/** Whether the revision can go to a device in its channel's format, and why not. */
export type Deployability = { ok: true } | { ok: false; reason: string };

/** Everything computed from a spec when a revision is saved; stored immutably beside the spec. */
export interface RevisionContent {
  design: FilterDesign;
  /**
   * The design quantized for the channel's device format, as the device runs it: a single design's
   * sections or taps, or a chain's stages in order (FIR stages as taps); null when it cannot be.
   */
  quantized: QuantizedDesign | null;
  analysis: AnalysisSummary & { deployable: Deployability };
}

/**
 * Designs a spec (a single design or a chain) and computes its stored content for a device format.
 * When quantization fails (a pole on the unit circle, a numerator that rounds to zero) the quantized
 * form is null and the revision is marked not deployable with the reason.
 */
export function buildRevisionContent(spec: FilterSpec, format: QuantFormat): RevisionContent {
  const design = designFilter(spec);
  const analysis = analyseDesign(design);
  try {
    const quantized = quantizeDesign(design, format);
    return { design, quantized, analysis: { ...analysis, deployable: deployability(analysis.stable, quantized) } };
  } catch (err) {
    const deployable: Deployability = { ok: false, reason: (err as Error).message };
    return { design, quantized: null, analysis: { ...analysis, deployable } };
  }
}

/** What a stored revision holds about its coefficients: the float design and the quantized form it was saved with. */
export interface StoredCoefficients {
  design: FilterDesign;
  /** The device format the revision was saved for. */
  format: QuantFormat;
  quantized: QuantizedDesign | null;
}

/**
 * A revision's coefficients in a format: the stored quantized form when the revision was saved for
 * that format, so a revision always goes out exactly as it was stored and reviewed (revisions saved
 * before chains keep their FIR designs as the sections they were stored with); otherwise the design
 * quantized now. Throws when the design cannot be quantized for the format.
 */
export function quantizationFor(rev: StoredCoefficients, format: QuantFormat): QuantizedDesign {
  if (rev.format === format && rev.quantized) return rev.quantized;
  return quantizeDesign(rev.design, format);
}

/** Refusal reasons in the order a reviewer would check them: the float design, then its quantized form. */
export function deployability(stable: boolean, quantized: QuantizedDesign): Deployability {
  if (!stable) return { ok: false, reason: "the design is unstable (a pole on or outside the unit circle)" };
  if (!quantized.stable) {
    return {
      ok: false,
      reason: `the ${quantized.format} coefficients are unstable: largest pole radius ${quantized.maxPoleRadius} after quantization`,
    };
  }
  return { ok: true };
}
