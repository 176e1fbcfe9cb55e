/**
 * Validated second-order-section coefficients packed as 5 numbers per section:
 * [b0, b1, b2, a1, a2] (a0 = 1 dropped; scipy.signal `sos` sign convention, so the
 * difference equation is y = b0·x + b1·x₋₁ + b2·x₋₂ − a1·y₋₁ − a2·y₋₂). Unitless.
 */
export function packSos(sos: number[][]): Float64Array {
  if (sos.length === 0) throw new Error("sos must have at least 1 section (got 0)");
  const packed = new Float64Array(sos.length * 5);
  sos.forEach((row, s) => {
    if (row.length !== 6) {
      throw new Error(`sos row ${s} must have 6 entries [b0, b1, b2, 1, a1, a2] (got ${row.length})`);
    }
    if (!row.every(Number.isFinite)) throw new Error(`sos row ${s} must hold finite numbers only`);
    if (row[3] !== 1) throw new Error(`sos row ${s} must have a0 = 1 (got ${row[3]})`);
    packed.set([row[0], row[1], row[2], row[4], row[5]], s * 5);
  });
  return packed;
}

/** Validated FIR taps (impulse response, unitless). */
export function packTaps(taps: number[]): Float64Array {
  if (taps.length === 0) throw new Error("taps must have at least 1 entry (got 0)");
  if (!taps.every(Number.isFinite)) throw new Error("taps must hold finite numbers only");
  return Float64Array.from(taps);
}
