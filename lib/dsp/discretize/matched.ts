import { polyMul } from "../poly";
import { polyPower } from "./poly-power";
import { exponentialRootPolynomial } from "./companion";

/**
 * Matched pole-zero equivalent of H(s) = num(s)/den(s) (equal length n + 1, den[0] ≠ 0) for sample
 * period T in s; returns b, a as coefficients of z⁰ … z⁻ⁿ with a[0] = 1.
 * Convention: the modified matched pole-zero method of Franklin, Powell & Workman, Digital Control
 * of Dynamic Systems, 3rd ed. §6.3.3 [from memory]: poles and finite zeros map by z = e^{sT}; of the
 * r zeros at s = ∞, r − 1 map to z = −1 and one stays at z = ∞ (a one-sample delay, leaving time to
 * compute). Gain: the DC gains match, H(z = 1) = H(s = 0). When H(s) has a net k-fold zero (k > 0)
 * or pole (k < 0) at s = 0, the DC gain is 0 or ∞; then the low-frequency asymptotes match instead:
 * lim_{s→0} H(s)/s^k = lim_{z→1} H(z)/((z − 1)/T)^k, i.e. the gains agree as ω → 0 (for 1/s this
 * yields T·z⁻¹/(1 − z⁻¹)). Poles and zeros at s = 0 shared by num and den cancel first.
 * The mapped polynomials come from exponentialRootPolynomial, so repeated poles need no root finding.
 */
export function matchedDiscretize(num: number[], den: number[], periodS: number): { b: number[]; a: number[] } {
  const n = den.length - 1;
  const numTrim = num.slice(num.findIndex((c) => c !== 0));
  const numOrigin = trailingZeros(numTrim);
  const denOrigin = trailingZeros(den);
  const k = numOrigin - denOrigin;
  const numCore = numTrim.slice(0, numTrim.length - numOrigin);
  const denCore = den.slice(0, den.length - denOrigin);

  const zerosAtOne = Math.max(k, 0);
  const polesAtOne = Math.max(-k, 0);
  const zerosAtInfinity = denCore.length - 1 + polesAtOne - (numCore.length - 1 + zerosAtOne);
  const mappedZeros = polyMul(
    exponentialRootPolynomial(numCore.map((c) => c / numCore[0]), periodS),
    polyPower([1, 1], Math.max(zerosAtInfinity - 1, 0)),
  );
  const mappedPoles = exponentialRootPolynomial(denCore.map((c) => c / denCore[0]), periodS);

  const atOne = (p: number[]) => p.reduce((acc, c) => acc + c, 0);
  const digitalAtOne = (periodS ** k * atOne(mappedZeros)) / atOne(mappedPoles);
  if (!(Math.abs(digitalAtOne) > 0) || !Number.isFinite(digitalAtOne)) {
    throw new Error(
      "matched: a pole or zero of H(s) lies at a nonzero multiple of j·2π·fs and maps to z = 1; " +
        "the gain cannot be matched",
    );
  }
  const analogLowFrequencyGain = numCore[numCore.length - 1] / denCore[denCore.length - 1];
  const gain = analogLowFrequencyGain / digitalAtOne;

  const a = polyMul(mappedPoles, polyPower([1, -1], polesAtOne));
  const bCore = polyMul(mappedZeros, polyPower([1, -1], zerosAtOne)).map((c) => c * gain);
  const b = [...new Array<number>(a.length - bCore.length).fill(0), ...bCore];
  const tail = new Array<number>(n + 1 - a.length).fill(0);
  return { b: [...b, ...tail], a: [...a, ...tail] };
}

function trailingZeros(poly: number[]): number {
  let count = 0;
  while (count < poly.length - 1 && poly[poly.length - 1 - count] === 0) count++;
  return count;
}
