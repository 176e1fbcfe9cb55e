import { z } from "zod";

/** Building blocks of the design-request schemas (spec.ts and the kinds in their own files). */

/**
 * Each spec field as the editor labels it, so that a refusal speaks the engineer's words, not the field's
 * identifier (the identifier still travels in the issue's path for tools).
 */
export const FIELD_WORDS: Record<string, string> = {
  sampleRateHz: "The sample rate",
  cutoffHz: "The cutoff",
  centerHz: "The centre frequency",
  q: "Q",
  gainDb: "The gain",
  taps: "The number of taps",
  kaiserBeta: "Kaiser β",
  stopbandAttenuationDb: "The stopband attenuation",
  passbandRippleDb: "The passband ripple",
  length: "The length",
  order: "The order",
  prewarpHz: "The prewarp frequency",
  fundamentalHz: "The fundamental",
  num: "The numerator b(s)",
  den: "The denominator a(s)",
  b: "b (numerator)",
  a: "a (denominator)",
  sos: "The SOS rows",
  bandsHz: "The band edges",
  desired: "The desired gains",
  weights: "The weights",
  freqsHz: "The frequencies",
  gains: "The gains",
  passbandHz: "The passband edge",
  stopbandHz: "The stopband edge",
  rippleDb: "The ripple",
  widthHz: "The transition width",
};

/** The words for a field (its editor label), or the field as given when it has none. */
export const words = (field: string): string => FIELD_WORDS[field] ?? field;

/** Half the sample rate in words, with its value: "half the sample rate (500 Hz)". */
export const halfRate = (fs: number): string => `half the sample rate (${fs / 2} Hz)`;

export const finite = (field: string) => z.number({ error: `${words(field)} must be a finite number` });

export const sampleRateHz = finite("sampleRateHz").positive({ error: "The sample rate must be a finite number above 0 Hz" });

export const coefficientList = (field: string, max: number) =>
  z
    .array(z.number({ error: `${words(field)}: every coefficient must be a finite number` }), { error: `${words(field)} must be a list of numbers` })
    .min(1, { error: `${words(field)} needs at least 1 coefficient` })
    .max(max, { error: `${words(field)} may have at most ${max} coefficients` });

export type Ctx = z.RefinementCtx;

export function refuse(ctx: Ctx, path: Array<string | number>, message: string): void {
  ctx.addIssue({ code: "custom", path, message });
}

export function checkBelowNyquist(ctx: Ctx, field: string, value: number, fs: number): void {
  if (!(value > 0 && value < fs / 2)) {
    refuse(ctx, [field], `${words(field)} must be above 0 Hz and below ${halfRate(fs)} (got ${value} Hz)`);
  }
}

export function checkInteger(ctx: Ctx, field: string, value: number, min: number, max: number): void {
  if (!(Number.isInteger(value) && value >= min && value <= max)) {
    refuse(ctx, [field], `${words(field)} must be a whole number from ${min} to ${max} (got ${value})`);
  }
}
