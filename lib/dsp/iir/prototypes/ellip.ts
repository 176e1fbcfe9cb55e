import type { Complex } from "../../types";
import { cConj, cDiv } from "../../complex";
import { prodNeg, type Zpk } from "../zpk";
import { ellipdeg, ellipFComplement, ellipK, jacobiSnCnDn } from "../elliptic-functions";
import { requireOrder, requirePositiveDb } from "./order-check";

/** |sn| below this is treated as 0, dropping the zero at infinity of odd orders (scipy.signal ellipap). */
const SN_ZERO = 2e-16;

const pow10m1 = (x: number): number => Math.expm1(x * Math.LN10);

/**
 * Elliptic (Cauer) analog low-pass prototype: equiripple rippleDb in 0 ≤ ω ≤ 1 rad/s (passband edge at
 * 1 rad/s) and at least attenuationDb in the stopband. Zeros j/(√m·sn(jK/N, m)), poles from sn/cn/dn at
 * the imaginary shift v0 (S. J. Orfanidis, notes on elliptic filter design, Rutgers University, 2006, §3–§5;
 * scipy.signal ellipap convention). Needs attenuationDb > rippleDb.
 */
export function ellipap(order: number, rippleDb: number, attenuationDb: number): Zpk {
  requireOrder(order);
  requirePositiveDb("passband ripple", rippleDb);
  requirePositiveDb("stopband attenuation", attenuationDb);
  if (!(attenuationDb > rippleDb)) {
    throw new Error(`stopband attenuation (${attenuationDb} dB) must exceed the passband ripple (${rippleDb} dB)`);
  }
  if (order === 1) {
    const p = -Math.sqrt(1 / pow10m1(0.1 * rippleDb));
    return { zeros: [], poles: [[p, 0]], gain: -p };
  }
  const epsSq = pow10m1(0.1 * rippleDb);
  const eps = Math.sqrt(epsSq);
  const ck1Sq = epsSq / pow10m1(0.1 * attenuationDb);
  if (ck1Sq === 0) throw new Error("ripple and attenuation give a degenerate elliptic modulus");
  const k1 = ellipK(ck1Sq);
  const m = ellipdeg(order, ck1Sq);
  const capK = ellipK(m);

  const upperZeros: Complex[] = [];
  const upperPoles: Complex[] = [];
  // sn(jv | m) = j·sc(v | 1 − m) (A&S 16.20.1), so the imaginary shift is v0 = K·F(atan(1/ε) | 1 − m1)/(N·K1)
  const r = ellipFComplement(Math.atan(1 / eps), ck1Sq);
  const v0 = (capK * r) / (order * k1);
  const { sn: sv, cn: cv, dn: dv } = jacobiSnCnDn(v0, 1 - m);
  for (let j = 1 - (order % 2); j < order; j += 2) {
    const { sn: s, cn: c, dn: d } = jacobiSnCnDn((j * capK) / order, m);
    if (Math.abs(s) > SN_ZERO) upperZeros.push([0, 1 / (Math.sqrt(m) * s)]);
    const den = 1 - (d * sv) ** 2;
    upperPoles.push([-(c * d * sv * cv) / den, -(s * dv) / den]);
  }
  const zeros = [...upperZeros, ...upperZeros.map(cConj)];
  const norm = Math.sqrt(upperPoles.reduce((acc, p) => acc + p[0] * p[0] + p[1] * p[1], 0));
  const mirrored = order % 2 === 1 ? upperPoles.filter((p) => Math.abs(p[1]) > SN_ZERO * norm) : upperPoles;
  const poles = [...upperPoles, ...mirrored.map(cConj)];
  let gain = cDiv(prodNeg(poles), prodNeg(zeros))[0];
  if (order % 2 === 0) gain /= Math.sqrt(1 + epsSq);
  return { zeros, poles, gain };
}
