import { z } from "zod";
import { combOrder } from "./comb";
import { notchShapes } from "./notch";
import { NOTCH_LIMITS } from "./notch-spec";
import { checkBelowNyquist, finite, refuse, sampleRateHz } from "./spec-fields";

/** Limits of the comb (product choices). */
export const COMB_LIMITS = {
  /** Largest delay N = fs/f0 (the comb runs one N-sample delay line; devices run N/2 sections). */
  maxCombOrder: 128,
} as const;

/**
 * A notch or peak at every harmonic of fundamentalHz (scipy.signal.iircomb): sampleRateHz/fundamentalHz
 * must be an integer N (the delay of the comb) from 2 to maxCombOrder, and 1 < q ≤ maxBandwidthQ
 * (q = f0 / −3 dB bandwidth; at q ≤ 1 the notches would be as wide as their spacing).
 */
export const combSpecSchema = z
  .object({
    kind: z.literal("comb"),
    shape: z.enum(notchShapes),
    fundamentalHz: finite("fundamentalHz"),
    q: finite("q"),
    sampleRateHz,
  })
  .superRefine((spec, ctx) => {
    const { fundamentalHz: f0, sampleRateHz: fs } = spec;
    const maxQ = NOTCH_LIMITS.maxBandwidthQ;
    if (!(spec.q > 1 && spec.q <= maxQ)) {
      refuse(ctx, ["q"], `Q must be above 1 and at most ${maxQ} (got ${spec.q}): the −3 dB bandwidth (fundamental / Q) must be narrower than the spacing of the harmonics`);
    }
    checkBelowNyquist(ctx, "fundamentalHz", f0, fs);
    if (!(f0 > 0 && f0 < fs / 2)) return;
    const n = combOrder(f0, fs);
    if (n === null) {
      const shown = (f: number) => Number(f.toPrecision(6));
      const below = shown(fs / Math.ceil(fs / f0));
      const above = shown(fs / Math.floor(fs / f0));
      refuse(
        ctx,
        ["fundamentalHz"],
        `The sample rate divided by the fundamental must be a whole number (the comb delays by that many samples), but ${fs}/${f0} = ${fs / f0}; the nearest fundamentals that divide ${fs} Hz are ${below} Hz and ${above} Hz`,
      );
    } else if (n > COMB_LIMITS.maxCombOrder) {
      refuse(
        ctx,
        ["fundamentalHz"],
        `The sample rate divided by the fundamental gives ${n} samples of delay; at most ${COMB_LIMITS.maxCombOrder} are allowed (a fundamental of at least ${fs / COMB_LIMITS.maxCombOrder} Hz)`,
      );
    }
  });

export type CombSpec = z.infer<typeof combSpecSchema>;
