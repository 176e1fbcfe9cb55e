import { maxShift } from "./coefficient-quantizer";
import { wordLimits, type FixedFormat } from "./q-format";
import { quantizedParts, type QuantizedDesign, type QuantizedPart } from "./quantize-design";

/** Largest FIR length for which the float64 Q15 accumulator is provably exact (see simulate-fixed.ts). */
export const MAX_Q15_TAPS = 2 ** 22;

/** One section, or one FIR stage, of words as a bit-true run sees it. */
export interface FixedStage {
  /** Numerator words, newest input first (b0, b1, b2 or h0 … hN−1). */
  b: number[];
  /** Denominator words a1, a2 in OUR sign convention (subtracted); empty for FIR. */
  a: number[];
  shift: number;
}

/** Every part's stages in order, checked: a chain's parts run one after the other, like their sections. */
export function fixedStages(q: QuantizedDesign, format: FixedFormat): FixedStage[] {
  return quantizedParts(q).flatMap((part) => partStages(part, format));
}

function partStages(q: QuantizedPart, format: FixedFormat): FixedStage[] {
  const words = q.integers;
  if (!words) throw new Error(`the quantized design has no ${format} words`);
  if (words.length !== q.shifts.length) throw new Error(`need one shift per row of words (${words.length} rows, ${q.shifts.length} shifts)`);
  q.shifts.forEach((shift, i) => {
    if (!Number.isInteger(shift) || shift < 0 || shift > maxShift(format)) {
      throw new Error(`shift ${i} must be an integer in 0…${maxShift(format)} (got ${shift})`);
    }
  });
  const { min, max } = wordLimits(format);
  words.flat().forEach((w) => {
    if (!Number.isInteger(w) || w < min || w > max) throw new Error(`words must be integers in ${min}…${max} (got ${w})`);
  });
  if (q.taps) {
    if (format === "q15" && words[0].length > MAX_Q15_TAPS) {
      throw new Error(`a Q15 FIR may have at most ${MAX_Q15_TAPS} taps (got ${words[0].length})`);
    }
    return [{ b: words[0], a: [], shift: q.shifts[0] }];
  }
  return words.map((row, i) => {
    if (row.length !== 5) throw new Error(`section ${i} needs 5 words [b0, b1, b2, a1, a2] (got ${row.length})`);
    return { b: row.slice(0, 3), a: row.slice(3, 5), shift: q.shifts[i] };
  });
}
