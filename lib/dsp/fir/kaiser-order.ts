import { z } from "zod";
import { finite, halfRate, sampleRateHz } from "../spec-fields";
import { kaiserBeta } from "./windows";

/** Smallest ripple/attenuation in dB for which Kaiser's formulas hold (scipy.signal.kaiserord refuses below it). */
export const MIN_KAISER_RIPPLE_DB = 8;

/** What a Kaiser-window FIR must do: the ripple (or stopband attenuation) in dB and the transition width in Hz. */
export const firOrderRequirementSchema = z
  .object({
    rippleDb: finite("rippleDb"),
    widthHz: finite("widthHz"),
    sampleRateHz,
  })
  .superRefine((r, ctx) => {
    if (!(r.rippleDb >= MIN_KAISER_RIPPLE_DB && r.rippleDb <= 300)) {
      ctx.addIssue({ code: "custom", path: ["rippleDb"], message: `The ripple must be from ${MIN_KAISER_RIPPLE_DB} to 300 dB (Kaiser's formulas need at least ${MIN_KAISER_RIPPLE_DB} dB; got ${r.rippleDb} dB)` });
    }
    if (!(r.widthHz > 0 && r.widthHz <= r.sampleRateHz / 2)) {
      ctx.addIssue({ code: "custom", path: ["widthHz"], message: `The transition width must be above 0 Hz and at most ${halfRate(r.sampleRateHz)} (got ${r.widthHz} Hz)` });
    }
  });

export type FirOrderRequirement = z.infer<typeof firOrderRequirementSchema>;

/**
 * Taps and β of a Kaiser-window FIR that meets a ripple A dB (pass and stop alike) with a transition
 * Δf Hz wide, as scipy.signal.kaiserord: N = ⌈(A − 7.95)/2.285/(π·Δf/(fs/2)) + 1⌉ (Kaiser's order
 * formula plus one; Oppenheim & Schafer, Discrete-Time Signal Processing, 3rd ed., §7.5.3 — section from
 * memory) and β = kaiserBeta(A). N may be even or exceed the FIR tap limit; the editor says so.
 */
export function estimateFirOrder(requirement: FirOrderRequirement): { taps: number; beta: number } {
  const r = firOrderRequirementSchema.parse(requirement);
  const width = r.widthHz / (0.5 * r.sampleRateHz);
  const taps = (r.rippleDb - 7.95) / 2.285 / (Math.PI * width) + 1;
  return { taps: Math.ceil(taps), beta: kaiserBeta(r.rippleDb) };
}
