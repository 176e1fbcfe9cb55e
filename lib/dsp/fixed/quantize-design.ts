import { runForm, runPart, type RunForm, type RunPart, type SectionPart } from "../analysis/design-form";
import { transferAt } from "../analysis/evaluate";
import { formStability, stability } from "../analysis/stability";
import { directFormSections } from "../transfer";
import type { FilterDesign } from "../types";
import { quantizeGroup, quantizeSections } from "./coefficient-quantizer";
import { maxDeviationDb } from "./deviation";
import { spreadGainForm } from "./gain-spreading";
import { stageHeadroom, type StageHeadroom } from "./headroom";
import type { QuantFormat } from "./q-format";

/**
 * One quantized part. SOS: `sos` rows [b0, b1, b2, 1, a1, a2] hold the quantized coefficients as
 * real values, `integers` the words [b0, b1, b2, a1, a2] per section in OUR sign convention
 * (scipy.signal sos: y = b0·x + b1·x₋₁ + b2·x₋₂ − a1·y₋₁ − a2·y₋₂; firmware that adds the feedback
 * terms must negate a1 and a2), each word = coefficient / 2^shift · 2^F rounded to nearest, ties
 * away from zero. FIR: `taps` and one row of tap words, one shift.
 */
export interface QuantizedPart {
  sos?: number[][];
  taps?: number[];
  /** Q15/Q31 words per section (or one row of taps); absent for f32. */
  integers?: number[][];
  /** Post-shift per section (one for FIR); all 0 for f32. */
  shifts: number[];
}

/** A chain's quantized stage: its part and its index in the chain spec's stages. */
export interface QuantizedStage extends QuantizedPart {
  stage: number;
}

/**
 * A design with quantized coefficients, ready for simulateFixed or for export to firmware. A single
 * design holds its part's fields directly; a chain holds `stages` instead (and `shifts` is empty).
 */
export interface QuantizedDesign extends QuantizedPart {
  format: QuantFormat;
  sampleRateHz: number;
  stages?: QuantizedStage[];
  /** All quantized poles strictly inside the unit circle. */
  stable: boolean;
  /** Largest pole radius of the float64 design (dimensionless). */
  maxPoleRadiusBefore: number;
  /** Largest pole radius after quantization (dimensionless). */
  maxPoleRadius: number;
  /** Worst |ΔdB| of the magnitude response vs float64 (see deviation.ts for the grid and the −100 dB floor). */
  maxDeviationDb: number;
  /** Chains only: the level at each stage's output after the gain is spread (see headroom.ts). */
  headroom?: StageHeadroom[];
}

function checkFormat(format: QuantFormat): void {
  if (format !== "q15" && format !== "q31" && format !== "f32") {
    throw new Error(`format must be 'q15', 'q31' or 'f32' (got ${String(format)})`);
  }
}

function quantizePart(part: SectionPart, format: QuantFormat): QuantizedPart {
  if (part.kind === "sos") return quantizeSections(part.sos, format);
  const group = quantizeGroup(part.taps, format);
  return { taps: group.values, integers: group.words ? [group.words] : undefined, shifts: [group.shift] };
}

/**
 * A part as fixed point runs it: a direct form factored into sections (its roots paired by zpk2sos),
 * since rounding a high-order polynomial's coefficients moves its roots far more than rounding sections.
 */
function sectionPart(part: RunPart): SectionPart {
  return part.kind === "ba" ? { kind: "sos", sos: directFormSections(part.b, part.a) } : part;
}

/**
 * The run form of quantized parts (their real values), for the response and stability after
 * quantization; throws when rounding left a part that cannot run (an all-zero numerator or taps).
 */
function partsForm(parts: QuantizedPart[], chain: boolean): RunForm {
  return parts.map((p, i) => runPart(p, chain ? `quantized stage ${i + 1}: ` : ""));
}

/**
 * Quantize a design for a target format. SOS: the overall gain is first spread across sections by L∞
 * scaling (spreadGainForm), then each section is quantized with its own post-shift (quantizeSections).
 * FIR: all taps as one group with one post-shift. A chain keeps the engineer's stage order (it is what
 * was reviewed) and spreads the gain over every section and FIR stage of the whole chain with the same
 * L∞ rule, so no stage's output exceeds full scale for a full-scale sinusoid at any frequency; each stage
 * is then quantized as above. Unitless coefficients.
 */
export function quantizeDesign(design: FilterDesign, format: QuantFormat): QuantizedDesign {
  checkFormat(format);
  const form = runForm(design);
  const before = stability(design);
  const sections = form.map(sectionPart);
  const spread = sections.length === 1 && sections[0].kind === "taps" ? sections : spreadGainForm(sections, design.sampleRateHz);
  const parts = spread.map((part) => quantizePart(part, format));
  const quantizedForm = partsForm(parts, design.stages !== undefined);
  const after = formStability(quantizedForm);
  const summary = {
    format,
    sampleRateHz: design.sampleRateHz,
    stable: after.stable,
    maxPoleRadiusBefore: before.maxPoleRadius,
    maxPoleRadius: after.maxPoleRadius,
    maxDeviationDb: maxDeviationDb(
      (w) => transferAt(form, w),
      (w) => transferAt(quantizedForm, w),
    ),
  };
  if (design.stages === undefined) return { ...summary, ...parts[0] };
  const stages = design.stages.map((s, i) => ({ stage: s.stage, ...parts[i] }));
  return { ...summary, stages, shifts: [], headroom: stageHeadroom(quantizedForm, design.sampleRateHz) };
}

/** The quantized parts of a design in order: a chain's stages, or the single design as one part. */
export function quantizedParts(q: QuantizedDesign): QuantizedPart[] {
  return q.stages ?? [q];
}
