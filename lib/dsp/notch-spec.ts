import { z } from "zod";
import { notchShapes } from "./notch";
import { checkBelowNyquist, finite, halfRate, refuse, sampleRateHz } from "./spec-fields";

/** Limits of the bandwidth-convention notch and comb (product choices). */
export const NOTCH_LIMITS = {
  /** Largest q = f0 / (−3 dB bandwidth) of a notch, peak or comb. */
  maxBandwidthQ: 1000,
} as const;

/**
 * A notch or peak in the bandwidth convention (scipy.signal.iirnotch / iirpeak): q = centerHz divided by
 * the −3 dB bandwidth in Hz, which must stay below sampleRateHz/2.
 */
export const notchSpecSchema = z
  .object({
    kind: z.literal("notch"),
    shape: z.enum(notchShapes),
    centerHz: finite("centerHz"),
    q: finite("q"),
    sampleRateHz,
  })
  .superRefine((spec, ctx) => {
    checkBelowNyquist(ctx, "centerHz", spec.centerHz, spec.sampleRateHz);
    const max = NOTCH_LIMITS.maxBandwidthQ;
    if (!(spec.q > 0 && spec.q <= max)) refuse(ctx, ["q"], `Q must be above 0 and at most ${max} (got ${spec.q})`);
    else if (spec.centerHz > 0 && spec.centerHz / spec.q >= spec.sampleRateHz / 2) {
      refuse(
        ctx,
        ["q"],
        `The −3 dB bandwidth (centre frequency / Q = ${spec.centerHz / spec.q} Hz) must be below ${halfRate(spec.sampleRateHz)}; raise Q above ${(2 * spec.centerHz) / spec.sampleRateHz}`,
      );
    }
  });

export type NotchSpec = z.infer<typeof notchSpecSchema>;
