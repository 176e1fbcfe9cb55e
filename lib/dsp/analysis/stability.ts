import { cAbs } from "../complex";
import { polyRoots } from "../poly";
import type { FilterDesign } from "../types";
import { formSections, runForm, type RunForm } from "./design-form";

export interface Stability {
  /** True iff every pole lies strictly inside the unit circle (BIBO stability; FIR designs always; a chain iff every stage). */
  stable: boolean;
  /** Largest pole radius |p| (dimensionless); 0 for FIR (all poles at the origin). */
  maxPoleRadius: number;
}

/**
 * Stability of the coefficients that actually run: poles are the roots of each SOS denominator
 * z² + a1·z + a2 (not design.poles), stable iff all |p| < 1 (Oppenheim & Schafer, DTSP §5.2).
 */
export function stability(design: FilterDesign): Stability {
  return formStability(runForm(design));
}

/** stability of an already checked run form. */
export function formStability(form: RunForm): Stability {
  const sections = formSections(form);
  const maxPoleRadius = Math.max(...sections.flatMap((row) => polyRoots([1, row[4], row[5]]).map(cAbs)), 0);
  return { stable: maxPoleRadius < 1, maxPoleRadius };
}

/**
 * Stability triangle of one biquad denominator 1 + a1·z⁻¹ + a2·z⁻²: both poles lie strictly inside
 * the unit circle iff |a2| < 1 and |a1| < 1 + a2 (Jackson, Digital Filters and Signal Processing;
 * Oppenheim & Schafer ch. 6 — from memory).
 */
export function sectionInStabilityTriangle(a1: number, a2: number): boolean {
  return Math.abs(a2) < 1 && Math.abs(a1) < 1 + a2;
}
