import { cDiv, cMul } from "../complex";
import type { Complex } from "../types";
import type { RunForm, RunPart } from "./design-form";

/** Σ c_k·x^k for real c in ascending powers of x (Horner's rule, in scalars: FIR designs reach 1000+ taps). */
export function ascendingPolyAt(c: readonly number[], x: Complex): Complex {
  const [xr, xi] = x;
  let re = 0;
  let im = 0;
  for (let k = c.length - 1; k >= 0; k--) {
    const t = re * xr - im * xi + c[k];
    im = re * xi + im * xr;
    re = t;
  }
  return [re, im];
}

/**
 * H(e^{jω}) of a run form at ω rad/sample (dimensionless complex gain): the product over its parts
 * (a cascade multiplies, Oppenheim & Schafer, Discrete-Time Signal Processing, 3rd ed., §6.3) of each part's response.
 */
export function transferAt(form: RunForm, omega: number): Complex {
  let h: Complex = [1, 0];
  for (const part of form) h = cMul(h, partTransferAt(part, omega));
  return h;
}

/**
 * H(e^{jω}) of one part: the product over sections of (b0 + b1·z⁻¹ + b2·z⁻²)/(1 + a1·z⁻¹ + a2·z⁻²),
 * Σ h[n]·z⁻ⁿ for taps, or Σ b_k z⁻ᵏ / Σ a_k z⁻ᵏ for a direct form (Oppenheim & Schafer, Discrete-Time Signal Processing, 3rd ed., §5.1).
 */
export function partTransferAt(form: RunPart, omega: number): Complex {
  const x: Complex = [Math.cos(omega), -Math.sin(omega)];
  if (form.kind === "taps") return ascendingPolyAt(form.taps, x);
  if (form.kind === "ba") return cDiv(ascendingPolyAt(form.b, x), ascendingPolyAt(form.a, x));
  const x2: Complex = cMul(x, x);
  let h: Complex = [1, 0];
  for (const [b0, b1, b2, , a1, a2] of form.sos) {
    const num: Complex = [b0 + b1 * x[0] + b2 * x2[0], b1 * x[1] + b2 * x2[1]];
    const den: Complex = [1 + a1 * x[0] + a2 * x2[0], a1 * x[1] + a2 * x2[1]];
    h = cMul(h, cDiv(num, den));
  }
  return h;
}
