/** Fixed-point word formats: Q15 (16-bit) and Q31 (32-bit) two's-complement fractions. */
export type FixedFormat = "q15" | "q31";

/** Targets a design can be quantized for: the fixed formats, or IEEE-754 single precision. */
export type QuantFormat = FixedFormat | "f32";

/** Fraction bits F = B − 1 of a B-bit Q format (Q15: 15, Q31: 31). */
export function fractionBits(format: FixedFormat): number {
  if (format === "q15") return 15;
  if (format === "q31") return 31;
  throw new Error(`format must be 'q15' or 'q31' (got ${String(format)})`);
}

/** Word range [−2^F, 2^F − 1], i.e. values [−1, 1 − 2^−F] (Q15 max 0.999969482421875; common practice). */
export function wordLimits(format: FixedFormat): { min: number; max: number } {
  const one = 2 ** fractionBits(format);
  return { min: -one, max: one - 1 };
}

/**
 * Nearest integer to v, ties away from zero (±2.5 → ±3). Computed as floor plus an exact
 * fraction test, so it is exact for every double (adding 0.5 before flooring is not).
 */
export function roundHalfAway(v: number): number {
  const a = Math.abs(v);
  const whole = Math.floor(a);
  const rounded = a - whole >= 0.5 ? whole + 1 : whole;
  return v < 0 ? -rounded : rounded;
}

/**
 * The word for a real value x·2^scaleBits: rounded to nearest (ties away from zero), then
 * saturated to the format's word range. `saturated` tells whether the limit was hit, i.e. x was
 * outside [−1, 1 − 2^−F] after rounding (common practice; some embedded libraries truncate by default instead).
 */
export function toWord(x: number, format: FixedFormat): { word: number; saturated: boolean } {
  if (!Number.isFinite(x)) throw new Error(`a value to quantize must be finite (got ${x})`);
  const { min, max } = wordLimits(format);
  const rounded = roundHalfAway(x * 2 ** fractionBits(format));
  if (rounded > max) return { word: max, saturated: true };
  if (rounded < min) return { word: min, saturated: true };
  return { word: rounded, saturated: false };
}

/** Real value of a word: word · 2^−F (exact in float64 for Q15 and Q31). */
export function wordToReal(word: number, format: FixedFormat): number {
  return word / 2 ** fractionBits(format);
}
