import { cAbs, cDiv, cMul, cSub } from "../complex";
import { polyEval } from "../poly";
import type { Complex } from "../types";
import { magnitudeToDb } from "./units";
import { unwrappedArg } from "./unwrap";

/** An s-plane system in rad/s: zeros, poles and gain, or numerator and denominator in descending powers of s. */
export type AnalogSystem = { zeros: Complex[]; poles: Complex[]; gain: number } | { num: number[]; den: number[] };

export interface AnalogResponse {
  /** 20·log10|H(j·2πf)| in dB, floored at MAGNITUDE_FLOOR_DB (−400 dB). */
  magnitudeDb: number[];
  /** arg H(j·2πf) in rad, unwrapped along the given frequency order; 0 where H is exactly 0. */
  phaseRad: number[];
}

/**
 * Response of an analog (s-plane) system at s = j·2π·f for each f in Hz ≥ 0, to plot an analog
 * prototype beside its digital filter (scipy.signal freqs / freqs_zpk convention, with f in Hz).
 */
export function analogResponse(system: AnalogSystem, freqsHz: readonly number[]): AnalogResponse {
  const evaluate = analogEvaluator(system);
  const h = freqsHz.map((f) => {
    if (!Number.isFinite(f) || f < 0) throw new Error(`frequencies must be finite numbers ≥ 0 Hz (got ${f})`);
    return evaluate([0, 2 * Math.PI * f]);
  });
  return {
    magnitudeDb: h.map((v) => magnitudeToDb(cAbs(v))),
    phaseRad: unwrappedArg(h),
  };
}

function analogEvaluator(system: AnalogSystem): (s: Complex) => Complex {
  if ("num" in system) {
    const { num, den } = system;
    if (num.length === 0 || den.length === 0 || [...num, ...den].some((v) => !Number.isFinite(v))) {
      throw new Error("num and den must be non-empty lists of finite numbers (descending powers of s)");
    }
    if (den.every((v) => v === 0)) throw new Error("den must not be all zeros");
    return (s) => cDiv(polyEval(num, s), polyEval(den, s));
  }
  const { zeros, poles, gain } = system;
  if (!Number.isFinite(gain) || [...zeros, ...poles].some((r) => !Number.isFinite(r[0]) || !Number.isFinite(r[1]))) {
    throw new Error("zeros, poles and gain must be finite");
  }
  return (s) => {
    let h: Complex = [gain, 0];
    for (const z of zeros) h = cMul(h, cSub(s, z));
    for (const p of poles) h = cDiv(h, cSub(s, p));
    return h;
  };
}

