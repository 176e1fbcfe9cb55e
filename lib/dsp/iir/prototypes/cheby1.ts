import type { Complex } from "../../types";
import { prodNeg, type Zpk } from "../zpk";
import { requireOrder, requirePositiveDb } from "./order-check";

/**
 * Chebyshev type I analog low-pass prototype: equiripple of rippleDb in 0 ≤ ω ≤ 1 rad/s, passband edge at
 * 1 rad/s; poles −sinh(μ + jθ), μ = asinh(1/ε)/N, ε = √(10^(rp/10) − 1)
 * (Williams & Taylor, Electronic Filter Design Handbook ch. 2; scipy.signal cheb1ap convention).
 */
export function cheb1ap(order: number, rippleDb: number): Zpk {
  requireOrder(order);
  requirePositiveDb("passband ripple", rippleDb);
  const eps = Math.sqrt(10 ** (0.1 * rippleDb) - 1);
  const mu = Math.asinh(1 / eps) / order;
  const poles: Complex[] = [];
  for (let m = -order + 1; m < order; m += 2) {
    const theta = (Math.PI * m) / (2 * order);
    // sinh(μ + jθ) = sinh μ cos θ + j cosh μ sin θ
    poles.push([-Math.sinh(mu) * Math.cos(theta), -Math.cosh(mu) * Math.sin(theta)]);
  }
  let gain = prodNeg(poles)[0];
  if (order % 2 === 0) gain /= Math.sqrt(1 + eps * eps);
  return { zeros: [], poles, gain };
}
