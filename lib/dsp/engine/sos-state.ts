import { sosKernel, type SosKernel } from "./sos-kernel";
import { StateVector } from "./state-vector";
import { sosUnitStepState } from "./steady-state";

/** A cascade of second-order sections with its DF2T state (2 per section), run by a fast kernel. */
export class SosState extends StateVector {
  private readonly kernel: SosKernel;
  private readonly saved: Float64Array;

  /** `packed` is [b0, b1, b2, a1, a2] per section; `withStep` precomputes the step steady state (sosfilt_zi). */
  constructor(packed: Float64Array, withStep: boolean) {
    super((packed.length / 5) * 2, withStep ? () => sosUnitStepState(packed) : undefined);
    this.kernel = sosKernel(packed);
    this.saved = new Float64Array(this.z.length);
  }

  run(x: Float64Array, y: Float64Array, start: number, end: number): void {
    this.kernel(x, y, start, end, this.z);
  }

  /**
   * Run x[start..end) if it holds only finite samples and the states stay finite; otherwise undo
   * and return false. No input scan is needed: a non-finite input makes every later state of the
   * first section non-finite. With c non-finite, t = b0·c + p and q' = b2·c − a2·t are non-finite
   * (0·∞ and ∞ − ∞ are NaN); then p' = b1·c − a1·t + q holds q, the next t holds p', and the next
   * q' holds that t, so the pair never returns to finite values. Finite states at the end
   * therefore prove a clean block.
   */
  runIfFinite(x: Float64Array, y: Float64Array, start: number, end: number): boolean {
    const z = this.z;
    this.saved.set(z);
    this.kernel(x, y, start, end, z);
    for (let i = 0; i < z.length; i++) {
      if (z[i] - z[i] !== 0) {
        z.set(this.saved);
        return false;
      }
    }
    return true;
  }
}
