/** A filter with a pole at z = 1 has no steady state for a constant input: it cannot start at `initial: "step"`. */
export class NoSteadyState extends Error {
  constructor(message: string) {
    super(message);
    this.name = "NoSteadyState";
  }
}

/**
 * DF2T section states (2 per section) that hold a cascade at steady state for a constant
 * input of 1; multiply by the actual constant. Per section, lfilter_zi's 2×2 system
 * (I − Aᵀ)·zi = b[1:] − a[1:]·b0 solved in closed form, scaled by the DC gain of the sections
 * before it (scipy.signal `sosfilt_zi` convention). Throws when a section has a pole at z = 1.
 */
export function sosUnitStepState(packed: Float64Array): Float64Array {
  const sections = packed.length / 5;
  const zi = new Float64Array(sections * 2);
  let scale = 1;
  for (let s = 0; s < sections; s++) {
    const [b0, b1, b2, a1, a2] = packed.subarray(s * 5, s * 5 + 5);
    const aSum = 1 + a1 + a2;
    if (aSum === 0) {
      throw new NoSteadyState(`initial 'step' needs a finite DC gain, but section ${s} has 1 + a1 + a2 = 0`);
    }
    const r0 = b1 - a1 * b0;
    const r1 = b2 - a2 * b0;
    const z0 = (r0 + r1) / aSum;
    zi[2 * s] = scale * z0;
    zi[2 * s + 1] = scale * (r1 - a2 * z0);
    scale *= (b0 + b1 + b2) / aSum;
  }
  return zi;
}
