import type { Complex } from "../../types";
import { cDiv } from "../../complex";
import { prodNeg, type Zpk } from "../zpk";
import { requireOrder, requirePositiveDb } from "./order-check";

/**
 * Chebyshev type II (inverse Chebyshev) analog low-pass prototype: the stopband attenuation
 * attenuationDb is first reached at 1 rad/s; zeros at ±j/sin(mπ/(2N)), poles the reciprocals of a
 * Chebyshev-warped Butterworth ring (Williams & Taylor, Electronic Filter Design Handbook ch. 2;
 * scipy.signal cheb2ap convention).
 */
export function cheb2ap(order: number, attenuationDb: number): Zpk {
  requireOrder(order);
  requirePositiveDb("stopband attenuation", attenuationDb);
  const de = 1 / Math.sqrt(10 ** (0.1 * attenuationDb) - 1);
  const mu = Math.asinh(1 / de) / order;
  const zeros: Complex[] = [];
  for (let m = -order + 1; m < order; m += 2) {
    if (m === 0) continue;
    // −conj(j / sin(mπ/2N)) = j / sin(mπ/2N)
    zeros.push([0, 1 / Math.sin((m * Math.PI) / (2 * order))]);
  }
  const poles: Complex[] = [];
  for (let m = -order + 1; m < order; m += 2) {
    const theta = (Math.PI * m) / (2 * order);
    const warped: Complex = [-Math.sinh(mu) * Math.cos(theta), -Math.cosh(mu) * Math.sin(theta)];
    poles.push(cDiv([1, 0], warped));
  }
  const gain = cDiv(prodNeg(poles), prodNeg(zeros))[0];
  return { zeros, poles, gain };
}
