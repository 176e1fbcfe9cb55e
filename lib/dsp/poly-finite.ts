import { polyRoots } from "./poly";
import type { Complex } from "./types";

/**
 * polyRoots for coefficient lists handed in by users: throws instead of returning a root that overflows
 * (coefficients spanning more than the double range, e.g. [5e-324, 1]); `what` names the list.
 */
export function finiteRoots(coeffs: number[], what: string): Complex[] {
  const roots = polyRoots(coeffs);
  if (roots.some(([re, im]) => !Number.isFinite(re) || !Number.isFinite(im))) {
    throw new Error(
      `a root of ${what} lies beyond the double-precision range: its coefficients span too many orders of magnitude`,
    );
  }
  return roots;
}
