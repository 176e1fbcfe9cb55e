import { directFormDcGain } from "../dc-gain";
import { StateVector } from "./state-vector";
import { NoSteadyState } from "./steady-state";

/**
 * A transfer function b/a (a[0] = 1) run in direct form II transposed with the arithmetic of
 * scipy.signal `lfilter` (b and a zero-padded to one length L; per sample y = z[0] + b[0]·x, then
 * z[k−1] = (z[k] + x·b[k]) − y·a[k] for k = 1…L−2 and z[L−2] = x·b[L−1] − y·a[L−1]), so results agree
 * with lfilter bit for bit on IEEE-754 doubles. L − 1 states, unitless.
 */
export class DirectFormState extends StateVector {
  private readonly b: Float64Array;
  private readonly a: Float64Array;

  /** `withStep` precomputes the steady state for a constant input (lfilter_zi; throws when Σa = 0). */
  constructor(b: readonly number[], a: readonly number[], withStep: boolean) {
    const length = Math.max(b.length, a.length);
    const padded = (c: readonly number[]) => {
      const out = new Float64Array(length);
      out.set(c);
      return out;
    };
    super(length - 1, withStep ? () => unitStepState(padded(b), padded(a)) : undefined);
    this.b = padded(b);
    this.a = padded(a);
  }

  run(x: Float64Array, y: Float64Array, start: number, end: number): void {
    const { b, a, z } = this;
    const last = b.length - 1;
    if (last === 0) {
      for (let n = start; n < end; n++) y[n] = x[n] * b[0];
      return;
    }
    for (let n = start; n < end; n++) {
      const xn = x[n];
      const yn = z[0] + b[0] * xn;
      for (let k = 1; k < last; k++) z[k - 1] = z[k] + xn * b[k] - yn * a[k];
      z[last - 1] = xn * b[last] - yn * a[last];
      y[n] = yn;
    }
  }

  /** Run x[start..end) if every sample in it is finite (v − v = 0 exactly for finite v); otherwise do nothing and return false. */
  runIfFinite(x: Float64Array, y: Float64Array, start: number, end: number): boolean {
    for (let i = start; i < end; i++) if (x[i] - x[i] !== 0) return false;
    this.run(x, y, start, end);
    return true;
  }
}

/**
 * States that hold the filter at rest on a constant input of 1: with y = G = Σb/Σa, the recursion gives
 * z[k] = Σ_{m>k} (b[m] − a[m]·G) (lfilter_zi's linear system solved in closed form).
 */
function unitStepState(b: Float64Array, a: Float64Array): Float64Array {
  const gain = directFormDcGain(Array.from(b), Array.from(a));
  if (gain === null) throw new NoSteadyState("initial 'step' needs a finite DC gain, but the direct form has Σa = 0 (a pole at z = 1)");
  const z = new Float64Array(b.length - 1);
  let acc = 0;
  for (let k = b.length - 1; k >= 1; k--) {
    acc += b[k] - a[k] * gain;
    z[k - 1] = acc;
  }
  return z;
}
