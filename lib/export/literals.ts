/**
 * A C float literal for a float32 value: 9 significant digits, enough for any float32 to round-trip
 * through decimal (IEEE 754-2008 §5.12.2: 9 digits for binary32), with the `f` suffix.
 */
export function floatLiteral(v: number): string {
  if (!Number.isFinite(v)) throw new Error(`a C float literal must be finite (got ${v})`);
  return `${v.toPrecision(9)}f`;
}

/**
 * A C integer literal for a word. INT32_MIN is written (-2147483647 - 1): the literal 2147483648
 * does not fit an int, so `-2147483648` would be a negated long.
 */
export function wordLiteral(w: number): string {
  if (!Number.isInteger(w)) throw new Error(`a word must be an integer (got ${w})`);
  return w === -2147483648 ? "(-2147483647 - 1)" : String(w);
}

/** A Python float literal that round-trips the float64 value exactly (shortest form, `.0` on integers). */
export function pythonFloat(v: number): string {
  if (!Number.isFinite(v)) throw new Error(`a Python float literal must be finite (got ${v})`);
  return Number.isInteger(v) && Math.abs(v) < 1e21 ? v.toFixed(1) : String(v);
}

/** A C double constant for a rate in Hz: integers with `.0` (so the macro is a floating constant), others as JavaScript writes them. */
export function rateLiteral(hz: number): string {
  if (!Number.isFinite(hz)) throw new Error(`a rate must be finite (got ${hz})`);
  return Number.isInteger(hz) ? hz.toFixed(1) : String(hz);
}
