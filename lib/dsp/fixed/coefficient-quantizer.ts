import { fractionBits, toWord, wordToReal, type FixedFormat, type QuantFormat } from "./q-format";

/** Largest post-shift allowed: the accumulator is shifted right by F − shift ≥ 1 bit. */
export function maxShift(format: FixedFormat): number {
  return fractionBits(format) - 1;
}

/** Coefficients quantized as one group sharing a post-shift. */
export interface QuantizedGroup {
  /** Effective real values: word · 2^(shift − F) (or Math.fround(c) for f32). */
  values: number[];
  /** Words c / 2^shift · 2^F rounded to nearest (ties away from zero); absent for f32. */
  words?: number[];
  /** Post-shift: the words hold the coefficients divided by 2^shift; 0 for f32. */
  shift: number;
}

/**
 * Quantize a group of coefficients with the smallest post-shift (0 … F − 1) at which no word
 * saturates (the usual embedded post-shift convention: store {1.5, …} as {0.75, …} with shift 1).
 * f32: every coefficient rounded to single precision with Math.fround, shift 0. Unitless.
 */
export function quantizeGroup(coeffs: readonly number[], format: QuantFormat): QuantizedGroup {
  if (!coeffs.every(Number.isFinite)) throw new Error("coefficients to quantize must be finite numbers");
  if (format === "f32") return { values: coeffs.map(Math.fround), shift: 0 };
  for (let shift = 0; shift <= maxShift(format); shift++) {
    const quantized = coeffs.map((c) => toWord(c / 2 ** shift, format));
    if (quantized.some((q) => q.saturated)) continue;
    const words = quantized.map((q) => q.word);
    return { values: words.map((w) => wordToReal(w, format) * 2 ** shift), words, shift };
  }
  const largest = Math.max(...coeffs.map(Math.abs));
  throw new Error(
    `coefficient magnitude ${largest} needs a post-shift above ${maxShift(format)} for ${format}; ` +
      `magnitudes must stay below about ${2 ** maxShift(format)}`,
  );
}

/** Quantized cascade: rows [b0, b1, b2, 1, a1, a2], words [b0, b1, b2, a1, a2] per section, shifts. */
export interface QuantizedSections {
  sos: number[][];
  integers?: number[][];
  shifts: number[];
}

/**
 * Quantize each section's five coefficients b0, b1, b2, a1, a2 as one group (a0 = 1 is implied
 * and never stored). Words keep OUR sign convention (scipy.signal sos): firmware computing
 * y = b0·x + … + a1·y₋₁ + a2·y₋₂ (as common embedded DSP libraries do) must negate a1 and a2.
 */
export function quantizeSections(sos: number[][], format: QuantFormat): QuantizedSections {
  const groups = sos.map((row) => quantizeGroup([row[0], row[1], row[2], row[4], row[5]], format));
  return {
    sos: groups.map(({ values: [b0, b1, b2, a1, a2] }) => [b0, b1, b2, 1, a1, a2]),
    integers: format === "f32" ? undefined : groups.map((g) => g.words ?? []),
    shifts: groups.map((g) => g.shift),
  };
}
