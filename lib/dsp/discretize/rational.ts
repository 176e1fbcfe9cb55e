/**
 * An analog transfer function H(s) = num(s)/den(s), both in descending powers of s
 * (numpy.poly1d / scipy.signal convention), units of s in rad/s.
 */
export interface AnalogTransferFunction {
  num: number[];
  den: number[];
}

/** The largest denominator order accepted; above it the polynomial forms lose too much precision. */
export const MAX_ANALOG_ORDER = 20;

/**
 * Checks H(s) and returns num and den of equal length n + 1 (n = order of den), den[0] ≠ 0 and
 * leading zeros of both removed. Throws for non-finite values, all-zero polynomials, an improper
 * H(s) (degree of num above that of den) or an order above MAX_ANALOG_ORDER.
 */
export function properRational(tf: AnalogTransferFunction): { num: number[]; den: number[] } {
  for (const [name, poly] of [["num", tf.num], ["den", tf.den]] as const) {
    if (poly.length === 0) throw new Error(`${name} must have at least one coefficient`);
    if (poly.some((c) => !Number.isFinite(c))) throw new Error(`${name} coefficients must be finite numbers`);
    if (poly.every((c) => c === 0)) throw new Error(`${name} must have a nonzero coefficient`);
  }
  const num = stripLeadingZeros(tf.num);
  const den = stripLeadingZeros(tf.den);
  const n = den.length - 1;
  if (num.length - 1 > n) {
    throw new Error(
      `H(s) is improper: num has degree ${num.length - 1} but den has degree ${n}; ` +
        "the degree of num must be at most that of den",
    );
  }
  if (n > MAX_ANALOG_ORDER) {
    throw new Error(`den has degree ${n}; allowed 0 to ${MAX_ANALOG_ORDER}`);
  }
  return { num: [...new Array<number>(n + 1 - num.length).fill(0), ...num], den };
}

function stripLeadingZeros(poly: number[]): number[] {
  return poly.slice(poly.findIndex((c) => c !== 0));
}

/** Divides b and a by a[0] so that a[0] = 1; throws when a[0] is zero to working precision. */
export function normaliseLeading(
  b: number[],
  a: number[],
  why: string,
): { b: number[]; a: number[] } {
  const size = a.reduce((acc, c) => acc + Math.abs(c), 0);
  if (!(Math.abs(a[0]) > 8 * Number.EPSILON * size)) {
    throw new Error(`the discretised denominator has a0 = 0: ${why}`);
  }
  return { b: b.map((c) => c / a[0]), a: a.map((c) => c / a[0]) };
}
