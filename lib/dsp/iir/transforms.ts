import type { Complex } from "../types";
import { cAdd, cDiv, cMul, cScale, cSqrt, cSub } from "../complex";
import { prodNeg, type Zpk } from "./zpk";

/**
 * Analog frequency transformations of a low-pass prototype with cutoff 1 rad/s, in zpk form
 * (scipy.signal lp2lp_zpk / lp2hp_zpk / lp2bp_zpk / lp2bs_zpk convention; wo and bw in rad/s).
 */

function relativeDegree({ zeros, poles }: Zpk): number {
  const degree = poles.length - zeros.length;
  if (degree < 0) throw new Error("transfer function must have at least as many poles as zeros");
  return degree;
}

function requirePositive(name: string, value: number): void {
  if (!(Number.isFinite(value) && value > 0)) {
    throw new Error(`${name} must be a finite number > 0 rad/s (got ${value})`);
  }
}

/** s → s/wo: low-pass with cutoff wo rad/s. */
export function lp2lpZpk(proto: Zpk, wo: number): Zpk {
  requirePositive("wo", wo);
  const degree = relativeDegree(proto);
  return {
    zeros: proto.zeros.map((z) => cScale(z, wo)),
    poles: proto.poles.map((p) => cScale(p, wo)),
    gain: proto.gain * wo ** degree,
  };
}

/** s → wo/s: high-pass with cutoff wo rad/s; zeros at infinity move to the origin. */
export function lp2hpZpk(proto: Zpk, wo: number): Zpk {
  requirePositive("wo", wo);
  const degree = relativeDegree(proto);
  const w: Complex = [wo, 0];
  const ratio = cDiv(prodNeg(proto.zeros), prodNeg(proto.poles));
  return {
    zeros: [...proto.zeros.map((z) => cDiv(w, z)), ...zerosAt([0, 0], degree)],
    poles: proto.poles.map((p) => cDiv(w, p)),
    gain: proto.gain * ratio[0],
  };
}

/** Each point x → x ± sqrt(x² − wo²): the two images of x under s → (s² + wo²)/s. */
function splitAroundCentre(points: Complex[], wo: number): Complex[] {
  const roots = points.map((x) => cSqrt(cSub(cMul(x, x), [wo * wo, 0])));
  return [...points.map((x, i) => cAdd(x, roots[i])), ...points.map((x, i) => cSub(x, roots[i]))];
}

function zerosAt(point: Complex, count: number): Complex[] {
  return Array.from({ length: count }, (): Complex => [point[0], point[1]]);
}

/** s → (s² + wo²)/(bw·s): band-pass centred on wo rad/s with width bw rad/s. */
export function lp2bpZpk(proto: Zpk, wo: number, bw: number): Zpk {
  requirePositive("wo", wo);
  requirePositive("bw", bw);
  const degree = relativeDegree(proto);
  return {
    zeros: [...splitAroundCentre(proto.zeros.map((z) => cScale(z, bw / 2)), wo), ...zerosAt([0, 0], degree)],
    poles: splitAroundCentre(proto.poles.map((p) => cScale(p, bw / 2)), wo),
    gain: proto.gain * bw ** degree,
  };
}

/** s → bw·s/(s² + wo²): band-stop centred on wo rad/s with width bw rad/s; zeros at infinity go to ±j·wo. */
export function lp2bsZpk(proto: Zpk, wo: number, bw: number): Zpk {
  requirePositive("wo", wo);
  requirePositive("bw", bw);
  const degree = relativeDegree(proto);
  const half: Complex = [bw / 2, 0];
  const ratio = cDiv(prodNeg(proto.zeros), prodNeg(proto.poles));
  return {
    zeros: [
      ...splitAroundCentre(proto.zeros.map((z) => cDiv(half, z)), wo),
      ...zerosAt([0, wo], degree),
      ...zerosAt([0, -wo], degree),
    ],
    poles: splitAroundCentre(proto.poles.map((p) => cDiv(half, p)), wo),
    gain: proto.gain * ratio[0],
  };
}
