import { cArg } from "../complex";
import type { Complex } from "../types";

/**
 * Unwrapped phase in rad: whenever consecutive values jump by π or more, add the multiple of 2π that
 * brings the jump into [−π, π) (a jump of exactly +π is kept). Same rule as numpy.unwrap with the
 * default discont = π, so results compare directly with scipy.signal freqz/sosfreqz + numpy.unwrap.
 */
export function unwrapPhase(wrapped: readonly number[]): number[] {
  const out = wrapped.slice();
  let correction = 0;
  for (let i = 1; i < wrapped.length; i++) {
    const d = wrapped[i] - wrapped[i - 1];
    if (Math.abs(d) >= Math.PI) {
      let dd = mod(d + Math.PI, 2 * Math.PI) - Math.PI;
      if (dd === -Math.PI && d > 0) dd = Math.PI;
      correction += dd - d;
    }
    out[i] = wrapped[i] + correction;
  }
  return out;
}

/** Floored modulo with the sign of the divisor (numpy.mod / Python %). */
function mod(a: number, n: number): number {
  const r = a % n;
  return r !== 0 && r < 0 !== n < 0 ? r + n : r;
}

/** Unwrapped arg of complex values in rad; an exact zero has phase 0 (numpy.angle(0) convention). */
export function unwrappedArg(values: readonly Complex[]): number[] {
  return unwrapPhase(values.map((v) => (v[0] === 0 && v[1] === 0 ? 0 : cArg(v))));
}
