import type { Complex } from "../types";
import { cMul, cNeg } from "../complex";

/** A transfer function as zeros, poles and gain: H = gain · Π(x − zᵢ) / Π(x − pᵢ), x = s or z. */
export interface Zpk {
  zeros: Complex[];
  poles: Complex[];
  gain: number;
}

/** Π(−xᵢ), the product scipy.signal uses to keep the gain of transformed prototypes (scipy.signal convention). */
export function prodNeg(xs: Complex[]): Complex {
  return xs.reduce<Complex>((acc, x) => cMul(acc, cNeg(x)), [1, 0]);
}
