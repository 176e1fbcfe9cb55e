import { polyMul } from "../poly";

/** p(x)^k for an integer k ≥ 0 by repeated multiplication (descending powers; p^0 = [1]). */
export function polyPower(p: number[], k: number): number[] {
  let out = [1];
  for (let i = 0; i < k; i++) out = polyMul(out, p);
  return out;
}
