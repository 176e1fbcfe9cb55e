import { filterSignal } from "../engine/filter-signal";
import type { FilterDesign } from "../types";

/** First n samples of the response to a unit step u[k] = 1 for k ≥ 0, starting at rest (same units as the gain). */
export function stepResponse(design: FilterDesign, n: number): Float64Array {
  checkLength(n);
  return filterSignal(design, new Float64Array(n).fill(1));
}

/** First n samples of the response to a unit impulse δ[k], starting at rest: h[0..n−1]. */
export function impulseResponse(design: FilterDesign, n: number): Float64Array {
  checkLength(n);
  const x = new Float64Array(n);
  x[0] = 1;
  return filterSignal(design, x);
}

function checkLength(n: number): void {
  if (!Number.isInteger(n) || n < 1) throw new Error(`n must be an integer ≥ 1 samples (got ${n})`);
}
