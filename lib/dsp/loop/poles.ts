import { cAbs } from "../complex";
import { polyMul, polyRoots } from "../poly";
import type { Complex } from "../types";
import { filterTf, loopBlocks, type LoopBlocks } from "./blocks";
import { parseLoopModel } from "./schema";

/** Above this degree the characteristic polynomial's roots are flagged as indicative only. */
export const POLE_WARNING_DEGREE = 24;

/**
 * L(z) = num/den expanded to polynomials of equal length in ascending powers of z⁻¹ (num carries
 * the delay as leading zeros); read as descending powers of z they are z^n·num(z⁻¹) and z^n·den(z⁻¹).
 */
export function loopPolynomials(blocks: LoopBlocks): { num: number[]; den: number[] } {
  const f = blocks.filter ? filterTf(blocks.filter) : { b: [1], a: [1] };
  const num = [...new Array<number>(blocks.delaySamples).fill(0), ...polyMul(polyMul(blocks.controller.b, blocks.plant.b), f.b)];
  const den = polyMul(polyMul(blocks.controller.a, blocks.plant.a), f.a);
  const n = Math.max(num.length, den.length);
  const pad = (p: number[]) => [...p, ...new Array<number>(n - p.length).fill(0)];
  return { num: pad(num), den: pad(den) };
}

function checkGain(k: number): void {
  if (!Number.isFinite(k) || k < 0) throw new Error(`gains must be finite numbers ≥ 0 (got ${k})`);
}

export interface ClosedLoopPoles {
  /** Roots of den(z) + num(z) (z-plane). */
  poles: Complex[];
  degree: number;
  /** Largest pole radius; the closed loop is stable when it is below 1. */
  maxRadius: number;
  stable: boolean;
  /** A plain-words note when the degree is above POLE_WARNING_DEGREE, else null. */
  warning: string | null;
}

function warningFor(degree: number): string | null {
  return degree > POLE_WARNING_DEGREE
    ? `The characteristic polynomial has degree ${degree}; roots of expanded polynomials above degree ${POLE_WARNING_DEGREE} lose accuracy, so treat these poles as indicative and trust the margins.`
    : null;
}

/**
 * Closed-loop poles of unity feedback around L (the roots of 1 + L(z) = 0, i.e. of den + num;
 * Ogata, Discrete-Time Control Systems, 2nd ed., §4.2 — from memory), via polyRoots.
 */
export function closedLoopPoles(model: unknown): ClosedLoopPoles {
  const { num, den } = loopPolynomials(loopBlocks(parseLoopModel(model)));
  const poles = polyRoots(den.map((d, i) => d + num[i]));
  const maxRadius = poles.reduce((r, p) => Math.max(r, cAbs(p)), 0);
  return { poles, degree: poles.length, maxRadius, stable: maxRadius < 1, warning: warningFor(poles.length) };
}

/**
 * Root locus: for each gain k ≥ 0, the roots of den + k·num, the poles of 1 + k·L(z) (Evans 1950;
 * Ogata, Discrete-Time Control Systems, 2nd ed., §4.4 — from memory). k = 0 gives the open-loop poles.
 */
export function rootLocus(model: unknown, gains: readonly number[]): Complex[][] {
  gains.forEach(checkGain);
  const { num, den } = loopPolynomials(loopBlocks(parseLoopModel(model)));
  return gains.map((k) => polyRoots(den.map((d, i) => d + k * num[i])));
}
