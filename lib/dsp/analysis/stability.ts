import { cAbs } from "../complex";
import { polyRoots } from "../poly";
import type { FilterDesign } from "../types";
import { runForm, type RunForm, type RunPart } from "./design-form";

export interface Stability {
  /** True iff every pole lies strictly inside the unit circle (BIBO stability; FIR designs always; a chain iff every stage). */
  stable: boolean;
  /** Largest pole radius |p| (dimensionless); 0 for FIR (all poles at the origin). */
  maxPoleRadius: number;
}

/**
 * Stability of the coefficients that actually run: poles are the roots of each SOS denominator
 * z² + a1·z + a2 and of each direct form's a (not design.poles), stable iff all |p| < 1
 * (Oppenheim & Schafer, Discrete-Time Signal Processing, 3rd ed., §5.2).
 */
export function stability(design: FilterDesign): Stability {
  return formStability(runForm(design));
}

/** stability of an already checked run form. */
export function formStability(form: RunForm): Stability {
  const maxPoleRadius = Math.max(...form.flatMap(partPoleRadii), 0);
  return { stable: maxPoleRadius < 1, maxPoleRadius };
}

/** |p| of every pole of one running part (none for FIR taps). */
function partPoleRadii(part: RunPart): number[] {
  if (part.kind === "taps") return [];
  if (part.kind === "ba") return polyRoots(part.a).map(cAbs);
  return part.sos.flatMap((row) => polyRoots([1, row[4], row[5]]).map(cAbs));
}

/**
 * Stability triangle of one biquad denominator 1 + a1·z⁻¹ + a2·z⁻²: both poles lie strictly inside
 * the unit circle iff |a2| < 1 and |a1| < 1 + a2 (Jackson, Digital Filters and Signal Processing;
 * Oppenheim & Schafer, Discrete-Time Signal Processing, 3rd ed., ch. 6 — from memory).
 */
export function sectionInStabilityTriangle(a1: number, a2: number): boolean {
  return Math.abs(a2) < 1 && Math.abs(a1) < 1 + a2;
}
