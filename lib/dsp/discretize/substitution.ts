import { polyMul } from "../poly";
import { polyPower } from "./poly-power";
import { normaliseLeading } from "./rational";

/**
 * Substitutes s = (z − 1)/(T·(α·z + 1 − α)) into H(s) = num(s)/den(s) (num, den of equal length
 * n + 1, descending powers of s) and returns b, a as coefficients of z⁰, z⁻¹, … z⁻ⁿ with a[0] = 1.
 * This is the generalised bilinear transform (Zhang, Chen & Xue 2009; scipy.signal.cont2discrete
 * 'gbt'), T in s: α = 0 forward Euler, α = 1 backward Euler, α = ½ Tustin.
 */
export function substituteBilinearForm(
  num: number[],
  den: number[],
  periodS: number,
  alpha: number,
): { b: number[]; a: number[] } {
  const n = den.length - 1;
  const c = 1 / periodS;
  const b = new Array<number>(n + 1).fill(0);
  const a = new Array<number>(n + 1).fill(0);
  for (let k = 0; k <= n; k++) {
    const term = padFront(
      polyMul(polyPower([c, -c], n - k), polyPower([alpha, 1 - alpha], k)),
      n + 1,
    );
    term.forEach((t, i) => {
      b[i] += num[k] * t;
      a[i] += den[k] * t;
    });
  }
  return normaliseLeading(b, a, `den(s) has a root at s = ${c / alpha} rad/s, which this method maps to z = ∞`);
}

/** Pads a descending-power polynomial with leading zeros to the given length (same polynomial). */
function padFront(p: number[], length: number): number[] {
  const start = p.findIndex((c) => c !== 0);
  const trimmed = start < 0 ? [0] : p.slice(start);
  return [...new Array<number>(length - trimmed.length).fill(0), ...trimmed];
}
