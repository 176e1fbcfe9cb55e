import { transferAt } from "../analysis/evaluate";
import { stability } from "../analysis/stability";
import type { FilterDesign } from "../types";
import { quantizeGroup, quantizeSections } from "./coefficient-quantizer";
import { maxDeviationDb } from "./deviation";
import { spreadGain } from "./gain-spreading";
import type { QuantFormat } from "./q-format";

/**
 * A design with quantized coefficients, ready for simulateFixed or for export to firmware.
 * SOS designs: `sos` rows [b0, b1, b2, 1, a1, a2] hold the quantized coefficients as real values,
 * `integers` the words [b0, b1, b2, a1, a2] per section in OUR sign convention (scipy.signal sos:
 * y = b0·x + b1·x₋₁ + b2·x₋₂ − a1·y₋₁ − a2·y₋₂; firmware that adds the feedback terms must negate a1 and a2),
 * each word = coefficient / 2^shift · 2^F rounded to nearest, ties away from zero.
 * FIR designs: `taps` and one row of tap words, one shift.
 */
export interface QuantizedDesign {
  format: QuantFormat;
  sampleRateHz: number;
  sos?: number[][];
  taps?: number[];
  /** Q15/Q31 words per section (or one row of taps); absent for f32. */
  integers?: number[][];
  /** Post-shift per section (one for FIR); all 0 for f32. */
  shifts: number[];
  /** All quantized poles strictly inside the unit circle. */
  stable: boolean;
  /** Largest pole radius of the float64 design (dimensionless). */
  maxPoleRadiusBefore: number;
  /** Largest pole radius after quantization (dimensionless). */
  maxPoleRadius: number;
  /** Worst |ΔdB| of the magnitude response vs float64 (see deviation.ts for the grid and the −100 dB floor). */
  maxDeviationDb: number;
}

function checkFormat(format: QuantFormat): void {
  if (format !== "q15" && format !== "q31" && format !== "f32") {
    throw new Error(`format must be 'q15', 'q31' or 'f32' (got ${String(format)})`);
  }
}

/**
 * Quantize a design for a target format. SOS: the overall gain is first spread across sections
 * by L∞ scaling (spreadGain), then each section is quantized with its own post-shift
 * (quantizeSections). FIR: all taps as one group with one post-shift. Unitless coefficients.
 */
export function quantizeDesign(design: FilterDesign, format: QuantFormat): QuantizedDesign {
  checkFormat(format);
  const before = stability(design);
  if (design.taps) {
    const group = quantizeGroup(design.taps, format);
    const taps = group.values;
    return {
      format,
      sampleRateHz: design.sampleRateHz,
      taps,
      integers: group.words ? [group.words] : undefined,
      shifts: [group.shift],
      stable: true,
      maxPoleRadiusBefore: 0,
      maxPoleRadius: 0,
      maxDeviationDb: maxDeviationDb(
        (w) => transferAt({ kind: "taps", taps: design.taps ?? [] }, w),
        (w) => transferAt({ kind: "taps", taps }, w),
      ),
    };
  }
  const reference = design.sos ?? [];
  const quantized = quantizeSections(spreadGain(reference, design.sampleRateHz), format);
  const after = stability({ ...design, sos: quantized.sos });
  return {
    format,
    sampleRateHz: design.sampleRateHz,
    ...quantized,
    stable: after.stable,
    maxPoleRadiusBefore: before.maxPoleRadius,
    maxPoleRadius: after.maxPoleRadius,
    maxDeviationDb: maxDeviationDb(
      (w) => transferAt({ kind: "sos", sos: reference }, w),
      (w) => transferAt({ kind: "sos", sos: quantized.sos }, w),
    ),
  };
}
