/**
 * The DF2T states of a recursive filter (unitless) and, when built for it, their values at rest on a
 * constant input of 1, so that settle(v) can start the filter at the steady state of v.
 */
export abstract class StateVector {
  protected readonly z: Float64Array;
  private readonly unitStep: Float64Array | undefined;

  /** `unitStep`, when given, computes the states for a constant input of 1 (once, here). */
  protected constructor(length: number, unitStep: (() => Float64Array) | undefined) {
    this.z = new Float64Array(length);
    this.unitStep = unitStep?.();
  }

  clear(): void {
    this.z.fill(0);
  }

  /** Steady state for a constant input v: the unit-step states times v (scipy.signal sosfilt_zi / lfilter_zi · v). */
  settle(v: number): void {
    const unit = this.unitStep;
    if (!unit) throw new Error("settle needs the step steady state, built with withStep = true");
    for (let i = 0; i < unit.length; i++) this.z[i] = unit[i] * v;
  }
}
