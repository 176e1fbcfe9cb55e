import { z } from "zod";
import { finite, halfRate, sampleRateHz, words } from "../spec-fields";

export const IIR_FAMILIES = ["butterworth", "chebyshev1", "chebyshev2", "elliptic", "bessel"] as const;
export const IIR_RESPONSES = ["lowpass", "highpass", "bandpass", "bandstop"] as const;
export type IirFamily = (typeof IIR_FAMILIES)[number];
export type IirResponse = (typeof IIR_RESPONSES)[number];

/** Highest order per response; band designs count per edge, so N gives 2N poles (scipy.signal convention). */
export const MAX_ORDER: Record<IirResponse, number> = { lowpass: 12, highpass: 12, bandpass: 6, bandstop: 6 };

export const isBand = (response: IirResponse): boolean => response === "bandpass" || response === "bandstop";

export { finite };

/** One frequency or a pair, each a finite number (Hz). */
export const frequencyOrPair = (what: string) =>
  z.union([finite(what), z.tuple([finite(what), finite(what)])], {
    error: `${words(what)} must be a finite number (Hz), or a pair [low, high] of them`,
  });

/** Cutoffs in Hz: one number for low/high-pass, a strictly increasing pair for band-pass/band-stop. */
export function checkCutoffs(
  ctx: z.RefinementCtx,
  path: string,
  cutoffHz: number | [number, number],
  response: IirResponse,
  sampleRateHz: number,
): void {
  const nyquist = sampleRateHz / 2;
  const inRange = (f: number) => f > 0 && f < nyquist;
  const range = `above 0 Hz and below ${halfRate(sampleRateHz)}`;
  const name = words(path);
  if (!isBand(response)) {
    if (typeof cutoffHz !== "number") {
      ctx.addIssue({ code: "custom", path: [path], message: `${name} must be a single frequency for a ${response} (${range})` });
    } else if (!inRange(cutoffHz)) {
      ctx.addIssue({ code: "custom", path: [path], message: `${name} must be ${range} (got ${cutoffHz} Hz)` });
    }
    return;
  }
  if (typeof cutoffHz === "number") {
    ctx.addIssue({ code: "custom", path: [path], message: `${name} must be a pair [low, high] for a ${response}, each ${range}` });
    return;
  }
  cutoffHz.forEach((f, i) => {
    if (!inRange(f)) ctx.addIssue({ code: "custom", path: [path, i], message: `${i === 0 ? "The low edge" : "The high edge"} must be ${range} (got ${f} Hz)` });
  });
  if (!(cutoffHz[0] < cutoffHz[1])) {
    ctx.addIssue({ code: "custom", path: [path], message: `The low edge must be below the high edge (got ${cutoffHz[0]} Hz and ${cutoffHz[1]} Hz)` });
  }
}

/** Order must be an integer 1…MAX_ORDER[response]. */
export function checkOrder(ctx: z.RefinementCtx, order: number, response: IirResponse): void {
  const max = MAX_ORDER[response];
  if (!(Number.isInteger(order) && order >= 1 && order <= max)) {
    ctx.addIssue({ code: "custom", path: ["order"], message: `The order must be a whole number from 1 to ${max} for a ${response} (got ${order})` });
  }
}

/**
 * A classic IIR design request (Hz and dB). Cutoff meaning per family follows scipy.signal.iirfilter:
 * Butterworth −3 dB; Chebyshev I and elliptic passband edge; Chebyshev II stopband edge; Bessel per besselNorm.
 */
export const iirSpecSchema = z
  .object({
    kind: z.literal("iir"),
    family: z.enum(IIR_FAMILIES),
    response: z.enum(IIR_RESPONSES),
    order: finite("order"),
    cutoffHz: frequencyOrPair("cutoffHz"),
    sampleRateHz,
    passbandRippleDb: finite("passbandRippleDb").optional(),
    stopbandAttenuationDb: finite("stopbandAttenuationDb").optional(),
    besselNorm: z.enum(["phase", "delay", "mag"]).optional(),
  })
  .superRefine((spec, ctx) => {
    checkOrder(ctx, spec.order, spec.response);
    checkCutoffs(ctx, "cutoffHz", spec.cutoffHz, spec.response, spec.sampleRateHz);
    const needsRipple = spec.family === "chebyshev1" || spec.family === "elliptic";
    const needsAttenuation = spec.family === "chebyshev2" || spec.family === "elliptic";
    const { passbandRippleDb: rp, stopbandAttenuationDb: rs } = spec;
    if (needsRipple && !(rp !== undefined && rp > 0)) {
      ctx.addIssue({ code: "custom", path: ["passbandRippleDb"], message: `The passband ripple is required for ${spec.family} and must be above 0 dB` });
    }
    if (needsAttenuation && !(rs !== undefined && rs > 0)) {
      ctx.addIssue({ code: "custom", path: ["stopbandAttenuationDb"], message: `The stopband attenuation is required for ${spec.family} and must be above 0 dB` });
    }
    if (spec.family === "elliptic" && rp !== undefined && rs !== undefined && rp > 0 && rs > 0 && !(rs > rp)) {
      ctx.addIssue({ code: "custom", path: ["stopbandAttenuationDb"], message: `The stopband attenuation must be greater than the passband ripple (${rp} dB) for elliptic` });
    }
  });

export type IirSpec = z.infer<typeof iirSpecSchema>;
