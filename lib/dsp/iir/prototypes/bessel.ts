import type { Complex } from "../../types";
import { cAbs, cScale, cSub } from "../../complex";
import { polyRoots } from "../../poly";
import type { Zpk } from "../zpk";
import { requireOrder } from "./order-check";

/** How the Bessel prototype is scaled in frequency (scipy.signal besselap `norm`). */
export type BesselNorm = "phase" | "delay" | "mag";

/**
 * Reverse Bessel polynomial θ_N(s) = Σ a_k s^k, a_k = (2N−k)! / (2^{N−k} k! (N−k)!), in descending powers
 * (Thomson 1949, Proc. IEE III 96(44):487; OEIS A001498).
 */
export function reverseBesselPolynomial(order: number): number[] {
  requireOrder(order);
  const ascending = new Array<number>(order + 1);
  ascending[order] = 1;
  for (let k = order; k >= 1; k--) {
    ascending[k - 1] = (ascending[k] * (2 * order - k + 1) * k) / (2 * (order - k + 1));
  }
  return ascending.reverse();
}

/** ω (rad/s) where |gain / Π(jω − p)| = 1/√2, by bisection to full precision; the response is monotone. */
function minus3dbFrequency(poles: Complex[], gain: number): number {
  const excess = (w: number): number =>
    poles.reduce((acc, p) => acc - Math.log(cAbs(cSub([0, w], p))), Math.log(gain)) + 0.5 * Math.LN2;
  let lo = 0;
  let hi = 1;
  while (excess(hi) > 0) hi *= 2;
  for (let i = 0; i < 200 && hi - lo > Number.EPSILON * hi; i++) {
    const mid = (lo + hi) / 2;
    if (excess(mid) > 0) lo = mid;
    else hi = mid;
  }
  return (lo + hi) / 2;
}

/**
 * Bessel–Thomson analog low-pass prototype: poles are the roots of θ_N(s) (Thomson 1949), then
 * 'phase': scaled by a_0^(−1/N) so the phase is −Nπ/4 at 1 rad/s and the asymptotes match Butterworth;
 * 'delay': unscaled, group delay 1 s at DC; 'mag': scaled so |H| = −3.0103 dB at 1 rad/s
 * (scipy.signal besselap convention; Bond, "Bessel Filter Constants", 2003).
 */
export function besselap(order: number, norm: BesselNorm = "phase"): Zpk {
  requireOrder(order);
  const coeffs = reverseBesselPolynomial(order);
  const aLast = coeffs[order];
  const roots = polyRoots(coeffs);
  if (norm === "phase") {
    const scale = 10 ** (-Math.log10(aLast) / order);
    return { zeros: [], poles: roots.map((p) => cScale(p, scale)), gain: 1 };
  }
  if (norm === "delay") return { zeros: [], poles: roots, gain: aLast };
  const w = minus3dbFrequency(roots, aLast);
  return { zeros: [], poles: roots.map((p) => cScale(p, 1 / w)), gain: w ** -order * aLast };
}
