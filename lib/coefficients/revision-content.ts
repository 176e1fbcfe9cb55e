import { designFilter, quantizeDesign, type FilterDesign, type FilterSpec, type QuantFormat, type QuantizedDesign } from "@/lib/dsp";
import { analyseDesign, type AnalysisSummary } from "./analysis";
import { sectionsDesign } from "./sections";

/** Whether the revision can go to a device in its channel's format, and why not. */
export type Deployability = { ok: true } | { ok: false; reason: string };

/** Everything computed from a spec when a revision is saved; stored immutably beside the spec. */
export interface RevisionContent {
  design: FilterDesign;
  /** The design quantized for the channel's device format (sections, as the device runs it); null when it cannot be. */
  quantized: QuantizedDesign | null;
  analysis: AnalysisSummary & { deployable: Deployability };
}

/**
 * Designs a spec and computes its stored content for a device format. The quantized form is taken
 * from the sections form (sectionsDesign); when there is none (too many sections) the design is
 * quantized as it is, and when quantization itself fails (a pole on the unit circle) it is null; either
 * way the revision is marked not deployable with the reason.
 */
export function buildRevisionContent(spec: FilterSpec, format: QuantFormat): RevisionContent {
  const design = designFilter(spec);
  const analysis = analyseDesign(design);
  try {
    const quantized = quantizeDesign(sectionsDesign(design), format);
    return { design, quantized, analysis: { ...analysis, deployable: deployability(analysis.stable, quantized) } };
  } catch (err) {
    const deployable: Deployability = { ok: false, reason: (err as Error).message };
    return { design, quantized: quantizeOrNull(design, format), analysis: { ...analysis, deployable } };
  }
}

function quantizeOrNull(design: FilterDesign, format: QuantFormat): QuantizedDesign | null {
  try {
    return quantizeDesign(design, format);
  } catch {
    return null;
  }
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
