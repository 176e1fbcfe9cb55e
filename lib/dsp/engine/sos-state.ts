import { sosKernel, type SosKernel } from "./sos-kernel";
import { sosUnitStepState } from "./steady-state";

/** A cascade of second-order sections with its DF2T state (2 per section), run by a fast kernel. */
export class SosState {
  private readonly kernel: SosKernel;
  private readonly z: Float64Array;
  private readonly unitStep: Float64Array | undefined;

  /** `packed` is [b0, b1, b2, a1, a2] per section; `withStep` precomputes the step steady state. */
  constructor(packed: Float64Array, withStep: boolean) {
    this.kernel = sosKernel(packed);
    this.z = new Float64Array((packed.length / 5) * 2);
    this.unitStep = withStep ? sosUnitStepState(packed) : undefined;
  }

  clear(): void {
    this.z.fill(0);
  }

  /** Steady state for a constant input v: sosfilt_zi(sos) · v (scipy.signal convention). */
  settle(v: number): void {
    const unit = this.unitStep;
    if (!unit) throw new Error("settle needs the step steady state, built with withStep = true");
    for (let i = 0; i < unit.length; i++) this.z[i] = unit[i] * v;
  }

  run(x: Float64Array, y: Float64Array, start: number, end: number): void {
    this.kernel(x, y, start, end, this.z);
  }
}
