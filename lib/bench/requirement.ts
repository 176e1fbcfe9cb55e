import { estimateOrder, type IirSpec, type OrderRequirement } from "@/lib/dsp";

/** The IIR spec that meets a requirement at the order estimateOrder finds (ripple/attenuation kept where the family uses them). */
export function specFromRequirement(req: OrderRequirement): IirSpec {
  const { order, cutoffHz } = estimateOrder(req);
  const ripple = req.family === "chebyshev1" || req.family === "elliptic";
  const atten = req.family === "chebyshev2" || req.family === "elliptic";
  return {
    kind: "iir",
    family: req.family,
    response: req.response,
    order,
    cutoffHz,
    sampleRateHz: req.sampleRateHz,
    ...(ripple ? { passbandRippleDb: req.passbandRippleDb } : {}),
    ...(atten ? { stopbandAttenuationDb: req.stopbandAttenuationDb } : {}),
  };
}

/** A starting requirement at sample rate fs: pass to 0.08·fs, 40 dB down by 0.16·fs (product choice). */
export function defaultRequirement(fs: number): OrderRequirement {
  return {
    family: "butterworth",
    response: "lowpass",
    passbandHz: Math.round(fs * 0.08),
    stopbandHz: Math.round(fs * 0.16),
    passbandRippleDb: 1,
    stopbandAttenuationDb: 40,
    sampleRateHz: fs,
  };
}
