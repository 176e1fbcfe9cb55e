import { discretize } from "../discretize/discretize";
import { formPolynomials, runForm } from "../analysis/design-form";
import { polyMul } from "../poly";
import type { FilterDesign } from "../types";
import type { LoopController, LoopModel, PidController } from "./schema";

/** A digital transfer function Σ b_k z⁻ᵏ / Σ a_k z⁻ᵏ: coefficients in ascending powers of z⁻¹, a[0] = 1. */
export interface DigitalTf {
  b: number[];
  a: number[];
}

/** The loop's blocks at its sample rate: L(z) = C(z)·z⁻ᵈ·P(z)·F(z), F = 1 without a filter. */
export interface LoopBlocks {
  sampleRateHz: number;
  controller: DigitalTf;
  plant: DigitalTf;
  delaySamples: number;
  filter: FilterDesign | null;
}

/** p + q for polynomials in ascending powers of z⁻¹ (aligned at z⁰). */
function addAscending(p: readonly number[], q: readonly number[]): number[] {
  return Array.from({ length: Math.max(p.length, q.length) }, (_, i) => (p[i] ?? 0) + (q[i] ?? 0));
}

/** Sum of digital transfer functions over a common denominator (the product of the denominators). */
function sumTf(terms: DigitalTf[]): DigitalTf {
  return terms.reduce((acc, t) => ({
    b: addAscending(polyMul(acc.b, t.a), polyMul(t.b, acc.a)),
    a: polyMul(acc.a, t.a),
  }));
}

/**
 * The parallel PID Kp + Ki/s + Kd·s/(1 + s·Tf), Tf = Kd/(Kp·N) (Åström & Murray, Feedback Systems:
 * An Introduction for Scientists and Engineers, §10.5), with the integral and the filtered derivative each discretised by the chosen method and the
 * terms summed; absent terms (gain 0) add no states.
 */
function pidTf(c: PidController, fs: number): DigitalTf {
  const opts = c.prewarpHz === undefined ? {} : { prewarpHz: c.prewarpHz };
  const terms: DigitalTf[] = [{ b: [c.kp], a: [1] }];
  if (c.ki > 0) terms.push(discretize({ num: [c.ki], den: [1, 0] }, fs, c.method, opts));
  if (c.kd > 0) terms.push(discretize({ num: [c.kd, 0], den: [c.kd / (c.kp * c.n), 1] }, fs, c.method, opts));
  return sumTf(terms);
}

/** C(z) of a PID or of C(s) = num/den, discretised by the controller's method (lib/dsp discretize). */
export function controllerTf(c: LoopController, fs: number): DigitalTf {
  if (c.kind === "pid") return pidTf(c, fs);
  return discretize({ num: c.num, den: c.den }, fs, c.method, c.prewarpHz === undefined ? {} : { prewarpHz: c.prewarpHz });
}

/**
 * The blocks of a validated loop model: the plant by zero-order hold (a plant driven by a DAC;
 * Franklin, Powell & Workman, Digital Control of Dynamic Systems, 3rd ed., §6.3.2), the controller by its method.
 */
export function loopBlocks(model: LoopModel): LoopBlocks {
  const fs = model.sampleRateHz;
  return {
    sampleRateHz: fs,
    controller: controllerTf(model.controller, fs),
    plant: discretize(model.plant, fs, "zoh"),
    delaySamples: model.delaySamples,
    filter: model.filter,
  };
}

/** F(z) of a design as one b/a pair (products of the sections' polynomials and of FIR taps; a chain's stages multiply). */
export function filterTf(design: FilterDesign): DigitalTf {
  return formPolynomials(runForm(design));
}
