import { z } from "zod";
import { biquadShapes, gainShapes } from "./biquad";
import { discretizationMethods } from "./discretize/discretize";
import { MAX_ANALOG_ORDER } from "./discretize/rational";
import { firResponses } from "./fir/windowed-sinc";
import { firWindows, zeroEndedWindows } from "./fir/windows";
import { COMB_LIMITS, combSpecSchema } from "./comb-spec";
import { FIR_DESIGN_LIMITS, firArbitrarySpecSchema, firEquirippleSpecSchema } from "./fir-design-spec";
import { checkCutoffs, iirSpecSchema } from "./iir/spec";
import { NOTCH_LIMITS, notchSpecSchema } from "./notch-spec";
import { checkBelowNyquist, checkInteger, coefficientList, finite, halfRate, refuse, sampleRateHz } from "./spec-fields";

/**
 * Limits of the design requests (product choices; each refusal message states the allowed range).
 * The totals bound the work one design costs (designing, analysing and quantizing it grows with its
 * sections and taps), so every request is bounded before it starts.
 */
export const SPEC_LIMITS = {
  maxQ: 1000,
  maxGainDb: 60,
  maxFirTaps: 1023,
  maxKaiserBeta: 100,
  maxAttenuationDb: 300,
  maxMovingAverageLength: 2048,
  maxPastedTaps: 1024,
  maxPastedDenominator: 65,
  maxSosRows: 32,
  maxChainStages: 8,
  ...NOTCH_LIMITS,
  ...COMB_LIMITS,
  ...FIR_DESIGN_LIMITS,
  /** Second-order sections of a whole design (all running stages together). */
  maxTotalSections: 64,
  /** FIR taps of a whole design. */
  maxTotalTaps: 2048,
  /** Order (degree of the transfer function) of a whole design. */
  maxTotalOrder: 2048,
} as const;

/** A cookbook biquad; gainDb is required by peaking and the shelves and refused by the other shapes. */
export const biquadSpecSchema = z
  .object({
    kind: z.literal("biquad"),
    shape: z.enum(biquadShapes),
    centerHz: finite("centerHz"),
    q: finite("q"),
    gainDb: finite("gainDb").optional(),
    sampleRateHz,
  })
  .superRefine((spec, ctx) => {
    checkBelowNyquist(ctx, "centerHz", spec.centerHz, spec.sampleRateHz);
    if (!(spec.q > 0 && spec.q <= SPEC_LIMITS.maxQ)) {
      refuse(ctx, ["q"], `Q must be above 0 and at most ${SPEC_LIMITS.maxQ} (got ${spec.q})`);
    }
    const max = SPEC_LIMITS.maxGainDb;
    if (gainShapes.includes(spec.shape)) {
      if (spec.gainDb === undefined) {
        refuse(ctx, ["gainDb"], `The gain is required for a ${spec.shape} biquad (−${max} to ${max} dB)`);
      } else if (Math.abs(spec.gainDb) > max) {
        refuse(ctx, ["gainDb"], `The gain must be from −${max} to ${max} dB (got ${spec.gainDb} dB)`);
      }
    } else if (spec.gainDb !== undefined) {
      refuse(ctx, ["gainDb"], `A gain is only used by ${gainShapes.join(", ")}; remove it for a ${spec.shape}`);
    }
  });

/** A windowed-sinc FIR; the kaiser window takes exactly one of kaiserBeta and stopbandAttenuationDb. */
export const firSpecSchema = z
  .object({
    kind: z.literal("fir"),
    response: z.enum(firResponses),
    window: z.enum(firWindows),
    taps: finite("taps"),
    cutoffHz: z.union([finite("cutoffHz"), z.tuple([finite("cutoffHz"), finite("cutoffHz")])], {
      error: "The cutoff must be a frequency in Hz, or a pair [low, high] of them for bandpass and bandstop",
    }),
    kaiserBeta: finite("kaiserBeta").optional(),
    stopbandAttenuationDb: finite("stopbandAttenuationDb").optional(),
    sampleRateHz,
  })
  .superRefine((spec, ctx) => {
    checkInteger(ctx, "taps", spec.taps, 1, SPEC_LIMITS.maxFirTaps);
    if (zeroEndedWindows.includes(spec.window) && spec.taps === 2) {
      refuse(ctx, ["taps"], `The number of taps must be 1 or at least 3 for the ${spec.window} window (it is 0 at both ends)`);
    }
    if ((spec.response === "highpass" || spec.response === "bandstop") && spec.taps % 2 === 0) {
      refuse(ctx, ["taps"], `The number of taps must be odd for a ${spec.response} (an even-length linear-phase FIR has zero gain at half the sample rate)`);
    }
    checkCutoffs(ctx, "cutoffHz", spec.cutoffHz, spec.response, spec.sampleRateHz);
    const { kaiserBeta: beta, stopbandAttenuationDb: atten } = spec;
    if (spec.window !== "kaiser") {
      if (beta !== undefined) refuse(ctx, ["kaiserBeta"], "Kaiser β is only used by the Kaiser window");
      if (atten !== undefined) {
        refuse(ctx, ["stopbandAttenuationDb"], "A stopband attenuation is only used by the Kaiser window");
      }
      return;
    }
    if ((beta === undefined) === (atten === undefined)) {
      refuse(ctx, ["kaiserBeta"], "The Kaiser window needs exactly one of Kaiser β and the stopband attenuation");
    }
    if (beta !== undefined && !(beta >= 0 && beta <= SPEC_LIMITS.maxKaiserBeta)) {
      refuse(ctx, ["kaiserBeta"], `Kaiser β must be from 0 to ${SPEC_LIMITS.maxKaiserBeta} (got ${beta})`);
    }
    if (atten !== undefined && !(atten > 0 && atten <= SPEC_LIMITS.maxAttenuationDb)) {
      refuse(
        ctx,
        ["stopbandAttenuationDb"],
        `The stopband attenuation must be above 0 dB and at most ${SPEC_LIMITS.maxAttenuationDb} dB (got ${atten} dB)`,
      );
    }
  });

export const movingAverageSpecSchema = z
  .object({ kind: z.literal("moving-average"), length: finite("length"), sampleRateHz })
  .superRefine((spec, ctx) => checkInteger(ctx, "length", spec.length, 1, SPEC_LIMITS.maxMovingAverageLength));

export const differentiatorSpecSchema = z.object({ kind: z.literal("differentiator"), sampleRateHz });

export const emaSpecSchema = z
  .object({ kind: z.literal("ema"), cutoffHz: finite("cutoffHz"), sampleRateHz })
  .superRefine((spec, ctx) => checkBelowNyquist(ctx, "cutoffHz", spec.cutoffHz, spec.sampleRateHz));

/** An analog H(s) = num(s)/den(s) (descending powers of s, s in rad/s) and how to discretise it. */
export const analogSpecSchema = z
  .object({
    kind: z.literal("analog"),
    num: coefficientList("num", MAX_ANALOG_ORDER + 1),
    den: coefficientList("den", MAX_ANALOG_ORDER + 1),
    method: z.enum(discretizationMethods),
    prewarpHz: finite("prewarpHz").optional(),
    sampleRateHz,
  })
  .superRefine((spec, ctx) => {
    const degree = (p: number[]) => p.length - 1 - p.findIndex((c) => c !== 0);
    const allZero = (p: number[]) => p.length > 0 && p.every((c) => c === 0);
    if (allZero(spec.num)) refuse(ctx, ["num"], "The numerator b(s) needs a nonzero coefficient");
    if (allZero(spec.den)) refuse(ctx, ["den"], "The denominator a(s) needs a nonzero coefficient");
    else if (spec.num.some((c) => c !== 0) && spec.den.length > 0 && degree(spec.num) > degree(spec.den)) {
      refuse(
        ctx,
        ["num"],
        `H(s) must be proper: the numerator has degree ${degree(spec.num)}, more than the denominator's ${degree(spec.den)}`,
      );
    }
    if (spec.method === "tustin-prewarp") {
      if (spec.prewarpHz === undefined) {
        refuse(ctx, ["prewarpHz"], `A prewarp frequency is required for Tustin with prewarping (above 0 Hz and below ${halfRate(spec.sampleRateHz)})`);
      } else checkBelowNyquist(ctx, "prewarpHz", spec.prewarpHz, spec.sampleRateHz);
    } else if (spec.prewarpHz !== undefined) {
      refuse(ctx, ["prewarpHz"], "A prewarp frequency is only used by Tustin with prewarping");
    }
  });

/** Pasted coefficients: b (with optional a, default [1]) or sos rows [b0, b1, b2, a0, a1, a2]. */
export const coefficientsSpecSchema = z
  .object({
    kind: z.literal("coefficients"),
    b: coefficientList("b", SPEC_LIMITS.maxPastedTaps).optional(),
    a: coefficientList("a", SPEC_LIMITS.maxPastedDenominator).optional(),
    sos: z
      .array(
        z.array(z.number({ error: "every SOS coefficient must be a finite number" })).length(6, { error: "each SOS row must have 6 numbers [b0, b1, b2, a0, a1, a2]" }),
        { error: "The SOS rows must be a list of rows" },
      )
      .min(1, { error: "Give at least 1 SOS row" })
      .max(SPEC_LIMITS.maxSosRows, { error: `At most ${SPEC_LIMITS.maxSosRows} SOS rows are allowed` })
      .optional(),
    sampleRateHz,
  })
  .superRefine((spec, ctx) => {
    if (spec.sos !== undefined) {
      if (spec.b !== undefined) refuse(ctx, ["b"], "Give either b (and a) or SOS rows, not both");
      if (spec.a !== undefined) refuse(ctx, ["a"], "Give either b (and a) or SOS rows, not both");
      spec.sos.forEach((row, i) => {
        if (row.length !== 6) return;
        if (row[3] === 0) refuse(ctx, ["sos", i, 3], `SOS row ${i + 1} has a0 = 0; a0 must be nonzero`);
        if (row.slice(0, 3).every((c) => c === 0)) {
          refuse(ctx, ["sos", i], `SOS row ${i + 1} has an all-zero numerator`);
        }
      });
      return;
    }
    if (spec.b === undefined) {
      refuse(ctx, ["b"], "b (numerator) is required, with a (denominator) if any, unless SOS rows are given");
      return;
    }
    if (spec.b.length > 0 && spec.b.every((c) => c === 0)) refuse(ctx, ["b"], "b (numerator) needs a nonzero coefficient");
    if (spec.a !== undefined && spec.a[0] === 0) refuse(ctx, ["a", 0], "The first coefficient of a (denominator), a0, must be nonzero (it is normalised to 1)");
  });

/** Every single-stage design request, told apart by `kind` (a chain's stages are these). */
export const stageSpecSchema = z.discriminatedUnion("kind", [
  iirSpecSchema,
  biquadSpecSchema,
  firSpecSchema,
  movingAverageSpecSchema,
  differentiatorSpecSchema,
  emaSpecSchema,
  analogSpecSchema,
  coefficientsSpecSchema,
  notchSpecSchema,
  combSpecSchema,
  firEquirippleSpecSchema,
  firArbitrarySpecSchema,
]);

export type StageSpec = z.infer<typeof stageSpecSchema>;
export type BiquadSpec = z.infer<typeof biquadSpecSchema>;
export type FirSpec = z.infer<typeof firSpecSchema>;
export type MovingAverageSpec = z.infer<typeof movingAverageSpecSchema>;
export type DifferentiatorSpec = z.infer<typeof differentiatorSpecSchema>;
export type EmaSpec = z.infer<typeof emaSpecSchema>;
export type AnalogSpec = z.infer<typeof analogSpecSchema>;
export type CoefficientsSpec = z.infer<typeof coefficientsSpecSchema>;
