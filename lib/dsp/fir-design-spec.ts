import { z } from "zod";
import { firWindows, zeroEndedWindows } from "./fir/windows";
import { checkInteger, finite, refuse, sampleRateHz, words } from "./spec-fields";

/** Limits of the equiripple and arbitrary-magnitude FIR designs (product choices). */
export const FIR_DESIGN_LIMITS = {
  /** Equiripple taps: the Remez exchange costs about taps² per step, so past this it stops being interactive. */
  maxEquirippleTaps: 511,
  /** Bands of an equiripple design. */
  maxEquirippleBands: 8,
  /** Taps of an arbitrary-magnitude FIR. */
  maxArbitraryTaps: 1023,
  /** Points of its frequency/gain list. */
  maxArbitraryPoints: 64,
  /** Largest Kaiser β of its window. */
  maxArbitraryKaiserBeta: 100,
  /** Largest gain in its list (about +60 dB). */
  maxArbitraryGain: 1000,
} as const;

const numberList = (what: string, max: number) =>
  z
    .array(z.number({ error: `${words(what)}: every value must be a finite number` }), { error: `${words(what)} must be a list of numbers` })
    .min(1, { error: `${words(what)} need at least 1 value` })
    .max(max, { error: `${words(what)} may hold at most ${max} values` });

/**
 * An equiripple FIR (Parks–McClellan, as scipy.signal.remez): band edges in Hz as pairs from 0 to
 * sampleRateHz/2, strictly increasing, one desired gain and one weight (> 0, default 1) per band.
 */
export const firEquirippleSpecSchema = z
  .object({
    kind: z.literal("fir-equiripple"),
    taps: finite("taps"),
    bandsHz: numberList("bandsHz", 2 * FIR_DESIGN_LIMITS.maxEquirippleBands),
    desired: numberList("desired", FIR_DESIGN_LIMITS.maxEquirippleBands),
    weights: numberList("weights", FIR_DESIGN_LIMITS.maxEquirippleBands).optional(),
    sampleRateHz,
  })
  .superRefine((spec, ctx) => {
    checkInteger(ctx, "taps", spec.taps, 3, FIR_DESIGN_LIMITS.maxEquirippleTaps);
    const { bandsHz: edges, desired } = spec;
    const nyquist = spec.sampleRateHz / 2;
    if (edges.length !== 2 * desired.length) {
      refuse(ctx, ["bandsHz"], `The band edges need two values [low, high] per band: ${desired.length} desired gains, so ${2 * desired.length} edges (got ${edges.length})`);
    } else if (edges[0] !== 0 || edges[edges.length - 1] !== nyquist) {
      refuse(ctx, ["bandsHz"], `The band edges must start at 0 Hz and end at half the sample rate (${nyquist} Hz), so the response is pinned down at both ends (got ${edges[0]} … ${edges[edges.length - 1]} Hz)`);
    } else {
      edges.forEach((f, i) => {
        if (i > 0 && !(f > edges[i - 1])) {
          refuse(ctx, ["bandsHz", i], `band edges must increase strictly (edge ${i} is ${f} Hz after ${edges[i - 1]} Hz); leave a transition band between bands`);
        }
      });
    }
    if (spec.weights !== undefined) {
      if (spec.weights.length !== desired.length) refuse(ctx, ["weights"], `Give one weight per band (${desired.length}; got ${spec.weights.length})`);
      spec.weights.forEach((w, i) => {
        if (!(w > 0)) refuse(ctx, ["weights", i], `every weight must be > 0 (got ${w})`);
      });
    }
    if (spec.taps % 2 === 0 && edges.length === 2 * desired.length && edges[edges.length - 1] === nyquist && desired[desired.length - 1] !== 0) {
      refuse(ctx, ["taps"], "An even number of taps has zero gain at half the sample rate: use an odd number of taps, or desire 0 in the last band");
    }
  });

/**
 * An arbitrary-magnitude FIR (frequency sampling with a window, as scipy.signal.firwin2): gains at
 * frequencies from 0 to sampleRateHz/2, nondecreasing, a frequency at most twice (a jump), linear in between.
 */
export const firArbitrarySpecSchema = z
  .object({
    kind: z.literal("fir-arbitrary"),
    taps: finite("taps"),
    freqsHz: numberList("freqsHz", FIR_DESIGN_LIMITS.maxArbitraryPoints),
    gains: numberList("gains", FIR_DESIGN_LIMITS.maxArbitraryPoints),
    window: z.enum(firWindows),
    kaiserBeta: finite("kaiserBeta").optional(),
    sampleRateHz,
  })
  .superRefine((spec, ctx) => {
    const limits = FIR_DESIGN_LIMITS;
    checkInteger(ctx, "taps", spec.taps, 1, limits.maxArbitraryTaps);
    const { freqsHz: f, gains } = spec;
    const nyquist = spec.sampleRateHz / 2;
    if (gains.length !== f.length) refuse(ctx, ["gains"], `Give one gain per frequency (${f.length}; got ${gains.length})`);
    if (f.length < 2 || f[0] !== 0 || f[f.length - 1] !== nyquist) {
      refuse(ctx, ["freqsHz"], `The frequencies must start at 0 Hz and end at half the sample rate (${nyquist} Hz)`);
    } else {
      f.forEach((v, i) => {
        if (i > 0 && v < f[i - 1]) refuse(ctx, ["freqsHz", i], `The frequencies must not decrease (${v} Hz after ${f[i - 1]} Hz)`);
        else if (i > 1 && v === f[i - 2]) refuse(ctx, ["freqsHz", i], `a frequency may appear at most twice, for a jump (${v} Hz)`);
      });
      if (f[1] === 0 || f[f.length - 2] === nyquist) refuse(ctx, ["freqsHz"], "0 Hz and half the sample rate may each appear only once");
    }
    gains.forEach((g, i) => {
      if (!(Math.abs(g) <= limits.maxArbitraryGain)) refuse(ctx, ["gains", i], `every gain must be within ±${limits.maxArbitraryGain} (got ${g})`);
    });
    if (spec.taps % 2 === 0 && gains.length > 0 && gains[gains.length - 1] !== 0) {
      refuse(ctx, ["taps"], "An even number of taps has zero gain at half the sample rate: use an odd number of taps, or make the last gain 0");
    }
    if (zeroEndedWindows.includes(spec.window) && spec.taps === 2) {
      refuse(ctx, ["taps"], `The number of taps must be 1 or at least 3 for the ${spec.window} window (it is 0 at both ends)`);
    }
    if (spec.window === "kaiser") {
      const beta = spec.kaiserBeta;
      if (beta === undefined || !(beta >= 0 && beta <= limits.maxArbitraryKaiserBeta)) {
        refuse(ctx, ["kaiserBeta"], `The Kaiser window needs Kaiser β from 0 to ${limits.maxArbitraryKaiserBeta} (got ${beta})`);
      }
    } else if (spec.kaiserBeta !== undefined) refuse(ctx, ["kaiserBeta"], "Kaiser β is only used by the Kaiser window");
  });

export type FirEquirippleSpec = z.infer<typeof firEquirippleSpecSchema>;
export type FirArbitrarySpec = z.infer<typeof firArbitrarySpecSchema>;
