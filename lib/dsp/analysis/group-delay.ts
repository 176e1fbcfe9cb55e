import { cAbs, cAdd, cArg, cDiv, cMul } from "../complex";
import { polyRoots } from "../poly";
import type { Complex } from "../types";
import type { RunForm, RunPart } from "./design-form";
import { ascendingPolyAt } from "./evaluate";

/**
 * Group delay −dφ/dω in samples, computed analytically (never by differentiating unwrapped phase).
 *
 * FIR taps: scipy.signal.group_delay's derivative formula τ(ω) = Re(Σ n·h[n]·z⁻ⁿ / Σ h[n]·z⁻ⁿ) at z = e^{jω};
 * a direct form b/a: that of b minus that of a (the phase of a quotient is the difference).
 * SOS: per section, numerator minus denominator, summed over sections. Each of the two quadratics is
 * written as z^{−d}·c·Π(1 − z_k·z⁻¹), and the same derivative formula applied to one factor gives the
 * closed form for a root z_k = r·e^{jθ} (Oppenheim & Schafer, Discrete-Time Signal Processing, 3rd ed., §5.3):
 *   τ_k(ω) = r·((r − 1) + 2·sin²((ω−θ)/2)) / ((1 − r)² + 4r·sin²((ω−θ)/2)),
 * which is free of the cancellation the polynomial form suffers near a zero on the unit circle.
 *
 * Zeros on the unit circle: every root with |r − 1| ≤ ON_CIRCLE_TOLERANCE contributes exactly 1/2 sample,
 * its value at every other frequency, so the group delay stays finite and continuous through a notch
 * centre or a moving-average null. scipy.signal.group_delay instead warns and returns 0 at such points.
 * For taps the same limit is taken by deflating the tap polynomial at the evaluation point whenever
 * |Σ h[n]·z⁻ⁿ| is at rounding level. A pole on the unit circle likewise contributes −1/2.
 */
export const ON_CIRCLE_TOLERANCE = 1e-12;

/** Group delay in samples of a run form at each ω in rad/sample: the sum over its parts (phases of a cascade add). */
export function groupDelayAt(form: RunForm, omegas: readonly number[]): number[] {
  const total = new Array<number>(omegas.length).fill(0);
  for (const part of form) {
    partGroupDelayAt(part, omegas).forEach((tau, i) => {
      total[i] += tau;
    });
  }
  return total;
}

/** Group delay in samples of one part at each ω in rad/sample. */
export function partGroupDelayAt(form: RunPart, omegas: readonly number[]): number[] {
  if (form.kind === "taps") return polynomialDelays(form.taps, omegas);
  if (form.kind === "ba") {
    const den = polynomialDelays(form.a, omegas);
    return polynomialDelays(form.b, omegas).map((tau, i) => tau - den[i]);
  }
  const sections = form.sos.map((row) => ({ num: factor(row.slice(0, 3)), den: factor(row.slice(3, 6)) }));
  return omegas.map((w) => {
    let tau = 0;
    for (const { num, den } of sections) tau += factorDelay(num, w) - factorDelay(den, w);
    return tau;
  });
}

/** The derivative-formula group delay of one polynomial in z⁻¹ (taps, or b or a) at each ω. */
function polynomialDelays(c: number[], omegas: readonly number[]): number[] {
  const weighted = c.map((t, n) => n * t);
  const scale = c.reduce((s, t) => s + Math.abs(t), 0);
  return omegas.map((w) => firGroupDelay(c, weighted, scale, w));
}

interface Factored {
  /** Whole-sample delay d from leading zero coefficients. */
  delay: number;
  /** Roots z_k in the z-plane. */
  roots: Complex[];
}

/** c0 + c1·z⁻¹ + c2·z⁻² (ascending powers of z⁻¹, not all zero: see runForm) as z^{−d}·c·Π(1 − z_k·z⁻¹). */
function factor(c: number[]): Factored {
  const delay = c.findIndex((v) => v !== 0);
  return { delay, roots: polyRoots(c.slice(delay)) };
}

function factorDelay(f: Factored, omega: number): number {
  let tau = f.delay;
  for (const root of f.roots) tau += rootDelay(root, omega);
  return tau;
}

/** Group delay in samples of the factor (1 − z_k·z⁻¹) at ω rad/sample (closed form above). */
function rootDelay(root: Complex, omega: number): number {
  const r = cAbs(root);
  if (r === 0) return 0;
  if (Math.abs(r - 1) <= ON_CIRCLE_TOLERANCE) return 0.5;
  const s = Math.sin((omega - cArg(root)) / 2);
  const s2 = s * s;
  return (r * (r - 1 + 2 * s2)) / ((1 - r) * (1 - r) + 4 * r * s2);
}

/** Horner rounding bound factor: |Σ h[n]·z⁻ⁿ| below this × (N+1)·ε·Σ|h[n]| counts as an exact zero. */
const ROUNDING_FACTOR = 8;

/** τ(ω) for taps h[n], given n·h[n] as `weighted` and Σ|h[n]| as `scale`. */
function firGroupDelay(taps: readonly number[], weighted: readonly number[], scale: number, omega: number): number {
  const x: Complex = [Math.cos(omega), -Math.sin(omega)];
  const den = ascendingPolyAt(taps, x);
  if (cAbs(den) > roundingBound(taps.length, scale)) {
    return cDiv(ascendingPolyAt(weighted, x), den)[0];
  }
  let coeffs: Complex[] = taps.map((t): Complex => [t, 0]);
  let onCircleZeros = 0;
  while (coeffs.length > 1 && isRoundingLevel(coeffs, x)) {
    coeffs = deflate(coeffs, x);
    onCircleZeros++;
  }
  return onCircleZeros / 2 + derivativeRatio(coeffs, x);
}

/** Re(Σ n·q_n·xⁿ / Σ q_n·xⁿ) for complex coefficients q (ascending powers). */
function derivativeRatio(q: Complex[], x: Complex): number {
  let num: Complex = [0, 0];
  let den: Complex = [0, 0];
  for (let n = q.length - 1; n >= 0; n--) {
    num = cAdd(cMul(num, x), [n * q[n][0], n * q[n][1]]);
    den = cAdd(cMul(den, x), q[n]);
  }
  return cDiv(num, den)[0];
}

function isRoundingLevel(q: Complex[], x: Complex): boolean {
  let value: Complex = [0, 0];
  let scale = 0;
  for (let n = q.length - 1; n >= 0; n--) {
    value = cAdd(cMul(value, x), q[n]);
    scale += cAbs(q[n]);
  }
  return cAbs(value) <= roundingBound(q.length, scale);
}

/** Horner rounding bound for a polynomial of `length` coefficients with Σ|c| = scale on |x| = 1. */
function roundingBound(length: number, scale: number): number {
  return ROUNDING_FACTOR * length * Number.EPSILON * scale;
}

/** Quotient of Σ q_n·yⁿ by (y − x), synthetic division from the highest power (remainder dropped). */
function deflate(q: Complex[], x: Complex): Complex[] {
  const out: Complex[] = new Array(q.length - 1);
  let carry: Complex = [0, 0];
  for (let n = q.length - 1; n >= 1; n--) {
    carry = cAdd(q[n], cMul(x, carry));
    out[n - 1] = carry;
  }
  return out;
}
