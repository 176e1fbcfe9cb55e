import { formPolynomials, runForm } from "../analysis/design-form";
import { ascendingPolyAt, transferAt } from "../analysis/evaluate";
import { cAbs, cDiv } from "../complex";
import { polyRoots } from "../poly";
import type { Complex, FilterDesign } from "../types";
import { quantizeGroup } from "./coefficient-quantizer";
import { maxDeviationDb } from "./deviation";
import type { QuantFormat } from "./q-format";
import { quantizeDesign } from "./quantize-design";

/** What quantization does to a design when it runs as one high-order difference equation. */
export interface DirectFormQuantization {
  /** Quantized b (ascending powers of z⁻¹), real values including the exact float64 gain. */
  b: number[];
  /** Quantized a (ascending powers of z⁻¹, a0 = 1), real values. */
  a: number[];
  /** Post-shifts of the normalised numerator and of the denominator. */
  shifts: { b: number; a: number };
  stable: boolean;
  maxPoleRadius: number;
  maxDeviationDb: number;
}

/**
 * Quantize the same design expanded to direct form, b(z)/a(z) = Π sections, to show why
 * second-order sections matter: high-order polynomial coefficients are very sensitive, so
 * clustered poles move far or leave the unit circle (Oppenheim & Schafer, Discrete-Time Signal Processing, 3rd ed., ch. 6 — from memory).
 * Favourable to direct form on purpose: b is normalised to peak |b| = 1 and its gain kept exact
 * in float64, b and a1…aN get separate post-shifts, and a0 = 1 is not stored. FIR: the taps.
 * A chain is expanded as a whole: every stage's polynomials multiplied together.
 */
export function quantizeDirectForm(design: FilterDesign, format: QuantFormat): DirectFormQuantization {
  const form = runForm(design);
  const { b: bRef, a: aRef } = formPolynomials(form);
  const bPeak = Math.max(...bRef.map(Math.abs));
  if (!(bPeak > 0) || !Number.isFinite(bPeak)) throw new Error(`the numerator must be finite and non-zero (peak |b| = ${bPeak})`);
  const bGroup = quantizeGroup(bRef.map((v) => v / bPeak), format);
  const aGroup = quantizeGroup(aRef.slice(1), format);
  const b = bGroup.values.map((v) => v * bPeak);
  const a = [1, ...aGroup.values];
  const poles = a.length > 1 ? polyRoots(a) : [];
  const maxPoleRadius = Math.max(0, ...poles.map(cAbs));
  const ratioAt = (num: number[], den: number[]) => (w: number) => {
    const zInv: Complex = [Math.cos(w), -Math.sin(w)];
    return cDiv(ascendingPolyAt(num, zInv), ascendingPolyAt(den, zInv));
  };
  const reference = (w: number) => transferAt(form, w);
  return {
    b,
    a,
    shifts: { b: bGroup.shift, a: aGroup.shift },
    stable: maxPoleRadius < 1,
    maxPoleRadius,
    maxDeviationDb: maxDeviationDb(reference, ratioAt(b, a)),
  };
}

/** Sections vs direct form, side by side, for the same design and format. */
export interface StructureComparison {
  sections: { stable: boolean; maxPoleRadius: number; maxDeviationDb: number };
  directForm: { stable: boolean; maxPoleRadius: number; maxDeviationDb: number };
}

/** Quantize a design both ways (quantizeDesign and quantizeDirectForm) and report both. */
export function compareStructures(design: FilterDesign, format: QuantFormat): StructureComparison {
  const sections = quantizeDesign(design, format);
  const direct = quantizeDirectForm(design, format);
  return {
    sections: { stable: sections.stable, maxPoleRadius: sections.maxPoleRadius, maxDeviationDb: sections.maxDeviationDb },
    directForm: { stable: direct.stable, maxPoleRadius: direct.maxPoleRadius, maxDeviationDb: direct.maxDeviationDb },
  };
}
