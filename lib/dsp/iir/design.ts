import type { FilterDesign } from "../types";
import { bilinearZpk } from "./bilinear";
import { besselap } from "./prototypes/bessel";
import { buttap } from "./prototypes/butter";
import { cheb1ap } from "./prototypes/cheby1";
import { cheb2ap } from "./prototypes/cheby2";
import { ellipap } from "./prototypes/ellip";
import { iirSpecSchema, type IirSpec } from "./spec";
import { lp2bpZpk, lp2bsZpk, lp2hpZpk, lp2lpZpk } from "./transforms";
import type { Zpk } from "./zpk";
import { zpk2sos } from "./zpk2sos";

function validated(spec: IirSpec): IirSpec {
  const result = iirSpecSchema.safeParse(spec);
  if (!result.success) {
    throw new Error(`invalid IIR spec: ${result.error.issues.map((i) => `${i.path.join(".") || "spec"}: ${i.message}`).join("; ")}`);
  }
  return result.data;
}

/** Low-pass prototype with its critical frequency at 1 rad/s, chosen by family (scipy.signal iirfilter). */
function lowpassPrototype(spec: IirSpec): Zpk {
  const rp = spec.passbandRippleDb ?? NaN;
  const rs = spec.stopbandAttenuationDb ?? NaN;
  switch (spec.family) {
    case "butterworth":
      return buttap(spec.order);
    case "chebyshev1":
      return cheb1ap(spec.order, rp);
    case "chebyshev2":
      return cheb2ap(spec.order, rs);
    case "elliptic":
      return ellipap(spec.order, rp, rs);
    case "bessel":
      return besselap(spec.order, spec.besselNorm ?? "phase");
  }
}

/** Moves the prototype to the requested response at critical frequencies `edges` (rad/s in the target plane). */
function transform(proto: Zpk, response: IirSpec["response"], edges: number[]): Zpk {
  if (response === "lowpass") return lp2lpZpk(proto, edges[0]);
  if (response === "highpass") return lp2hpZpk(proto, edges[0]);
  const bw = edges[1] - edges[0];
  const wo = Math.sqrt(edges[0] * edges[1]);
  return response === "bandpass" ? lp2bpZpk(proto, wo, bw) : lp2bsZpk(proto, wo, bw);
}

const cutoffList = (cutoffHz: IirSpec["cutoffHz"]): number[] => (typeof cutoffHz === "number" ? [cutoffHz] : cutoffHz);

/**
 * Analog filter in the s-plane (rad/s) with critical frequencies 2π·cutoffHz and no prewarping — what
 * scipy.signal.iirfilter(..., analog=True) gives for Wn = 2π·cutoffHz; for drawing beside the digital response.
 */
export function analogPrototypeZpk(spec: IirSpec): Zpk {
  const s = validated(spec);
  return transform(lowpassPrototype(s), s.response, cutoffList(s.cutoffHz).map((f) => 2 * Math.PI * f));
}

/**
 * Digital IIR design as scipy.signal.iirfilter(N, cutoffHz, rp, rs, btype, ftype, output='sos', fs):
 * prototype → frequency transform at the prewarped edges Ω = 2·fs·tan(π·f/fs) → bilinear → zpk2sos.
 * Computed, like scipy, in normalised units (fs = 2, Ω = 4·tan(π·f/fs)), which gives the same digital filter.
 */
export function designIir(spec: IirSpec): FilterDesign {
  const s = validated(spec);
  const normalisedFs = 2;
  const warped = cutoffList(s.cutoffHz).map((f) => 2 * normalisedFs * Math.tan((Math.PI * ((2 * f) / s.sampleRateHz)) / normalisedFs));
  const analog = transform(lowpassPrototype(s), s.response, warped);
  const digital = bilinearZpk(analog.zeros, analog.poles, analog.gain, normalisedFs);
  return {
    sampleRateHz: s.sampleRateHz,
    sos: zpk2sos(digital.zeros, digital.poles, digital.gain),
    zeros: digital.zeros,
    poles: digital.poles,
    gain: digital.gain,
  };
}
