import { z } from "zod";
import { cAbs, cSub } from "../complex";
import { ellipK, ellipKm1 } from "./elliptic-functions";
import { fminbound } from "./fminbound";
import { besselap } from "./prototypes/bessel";
import { sampleRateHz } from "../spec-fields";
import { checkCutoffs, finite, frequencyOrPair, IIR_FAMILIES, IIR_RESPONSES, isBand, MAX_ORDER, type IirResponse } from "./spec";


/** Edges in the order each response needs: lowpass fp < fs; highpass fs < fp; bandpass s0 < p0 < p1 < s1; bandstop p0 < s0 < s1 < p1. */
function edgesInOrder(response: IirResponse, pass: number | [number, number], stop: number | [number, number]): boolean {
  if (typeof pass === "number" && typeof stop === "number") return response === "lowpass" ? pass < stop : stop < pass;
  if (typeof pass === "number" || typeof stop === "number") return false;
  return response === "bandpass"
    ? stop[0] < pass[0] && pass[1] < stop[1]
    : pass[0] < stop[0] && stop[1] < pass[1];
}

const EDGE_RULE: Record<IirResponse, string> = {
  lowpass: "the passband edge below the stopband edge",
  highpass: "the stopband edge below the passband edge",
  bandpass: "the passband inside the stopband edges (low stopband < low passband < high passband < high stopband)",
  bandstop: "the stopband inside the passband edges (low passband < low stopband < high stopband < high passband)",
};

/** What the filter must do, in Hz and dB (the inputs of scipy.signal buttord/cheb1ord/cheb2ord/ellipord with fs). */
export const orderRequirementSchema = z
  .object({
    family: z.enum(IIR_FAMILIES),
    response: z.enum(IIR_RESPONSES),
    passbandHz: frequencyOrPair("passbandHz"),
    stopbandHz: frequencyOrPair("stopbandHz"),
    passbandRippleDb: finite("passbandRippleDb").positive({ error: "The passband ripple must be above 0 dB" }),
    stopbandAttenuationDb: finite("stopbandAttenuationDb").positive({ error: "The stopband attenuation must be above 0 dB" }),
    sampleRateHz,
  })
  .superRefine((req, ctx) => {
    checkCutoffs(ctx, "passbandHz", req.passbandHz, req.response, req.sampleRateHz);
    checkCutoffs(ctx, "stopbandHz", req.stopbandHz, req.response, req.sampleRateHz);
    if (!edgesInOrder(req.response, req.passbandHz, req.stopbandHz)) {
      ctx.addIssue({ code: "custom", path: ["stopbandHz"], message: `a ${req.response} needs ${EDGE_RULE[req.response]}` });
    }
    if (!(req.stopbandAttenuationDb > req.passbandRippleDb)) {
      ctx.addIssue({ code: "custom", path: ["stopbandAttenuationDb"], message: `The stopband attenuation must be greater than the passband ripple (${req.passbandRippleDb} dB)` });
    }
  });

export type OrderRequirement = z.infer<typeof orderRequirementSchema>;
export interface OrderEstimate {
  order: number;
  cutoffHz: number | [number, number];
}

type ClassicFamily = "butter" | "cheby" | "ellip";
const list = (x: number | [number, number]): number[] => (typeof x === "number" ? [x] : [...x]);
const pow10m1 = (x: number): number => Math.expm1(x * Math.LN10);

/** Selectivity of a band-stop with one pass edge moved to wp (scipy.signal band_stop_obj). */
function bandStopOrder(wp: number, index: 0 | 1, passb: number[], stopb: number[], rp: number, rs: number, type: ClassicFamily): number {
  const p = [...passb];
  p[index] = wp;
  const nat = Math.min(...stopb.map((s) => Math.abs((s * (p[0] - p[1])) / (s * s - p[0] * p[1]))));
  const gstop = 10 ** (0.1 * rs);
  const gpass = 10 ** (0.1 * rp);
  if (type === "butter") return Math.log10((gstop - 1) / (gpass - 1)) / (2 * Math.log10(nat));
  if (type === "cheby") return Math.acosh(Math.sqrt((gstop - 1) / (gpass - 1))) / Math.acosh(nat);
  const arg1 = Math.sqrt((gpass - 1) / (gstop - 1));
  const arg0 = 1 / nat;
  return (ellipK(arg0 ** 2) * ellipK(1 - arg1 ** 2)) / (ellipK(1 - arg0 ** 2) * ellipK(arg1 ** 2));
}

/**
 * Prewarped edges (tan(π·f/fs)) and the selectivity ratio nat of the equivalent low-pass; for band-stop the
 * pass edges are first moved inward by fminbound to lower the order (scipy.signal *ord convention).
 */
function selectivity(req: OrderRequirement, type: ClassicFamily): { passb: number[]; nat: number } {
  const passb = list(req.passbandHz).map((f) => Math.tan((Math.PI * ((2 * f) / req.sampleRateHz)) / 2));
  const stopb = list(req.stopbandHz).map((f) => Math.tan((Math.PI * ((2 * f) / req.sampleRateHz)) / 2));
  const rp = req.passbandRippleDb;
  const rs = req.stopbandAttenuationDb;
  let nats: number[];
  switch (req.response) {
    case "lowpass":
      nats = [stopb[0] / passb[0]];
      break;
    case "highpass":
      nats = [passb[0] / stopb[0]];
      break;
    case "bandstop":
      passb[0] = fminbound((w) => bandStopOrder(w, 0, passb, stopb, rp, rs, type), passb[0], stopb[0] - 1e-12);
      passb[1] = fminbound((w) => bandStopOrder(w, 1, passb, stopb, rp, rs, type), stopb[1] + 1e-12, passb[1]);
      nats = stopb.map((s) => (s * (passb[0] - passb[1])) / (s * s - passb[0] * passb[1]));
      break;
    case "bandpass":
      nats = stopb.map((s) => (s * s - passb[0] * passb[1]) / (s * (passb[0] - passb[1])));
      break;
  }
  return { passb, nat: Math.min(...nats.map(Math.abs)) };
}

const unwarp = (req: OrderRequirement, w: number[]): number | [number, number] => {
  const hz = w.map((x) => ((2 / Math.PI) * Math.atan(x) * req.sampleRateHz) / 2);
  return hz.length === 1 ? hz[0] : [hz[0], hz[1]];
};

/** scipy.signal.buttord: order and the −3 dB natural frequency that meets the passband edge exactly. */
function buttord(req: OrderRequirement): OrderEstimate {
  const { passb, nat } = selectivity(req, "butter");
  const gstop = 10 ** (0.1 * req.stopbandAttenuationDb);
  const gpass = 10 ** (0.1 * req.passbandRippleDb);
  const order = Math.ceil(Math.log10((gstop - 1) / (gpass - 1)) / (2 * Math.log10(nat)));
  const w0 = (gpass - 1) ** (-1 / (2 * order));
  let wn: number[];
  if (req.response === "lowpass") wn = [w0 * passb[0]];
  else if (req.response === "highpass") wn = [passb[0] / w0];
  else if (req.response === "bandstop") {
    const discr = Math.sqrt((passb[1] - passb[0]) ** 2 + 4 * w0 ** 2 * passb[0] * passb[1]);
    wn = [(passb[1] - passb[0] + discr) / (2 * w0), (passb[1] - passb[0] - discr) / (2 * w0)].map(Math.abs).sort((a, b) => a - b);
  } else {
    wn = [-w0, w0]
      .map((w) => (-w * (passb[1] - passb[0])) / 2 + Math.sqrt((w ** 2 / 4) * (passb[1] - passb[0]) ** 2 + passb[0] * passb[1]))
      .map(Math.abs)
      .sort((a, b) => a - b);
  }
  return { order, cutoffHz: unwarp(req, wn) };
}

const chebyshevOrder = (req: OrderRequirement, nat: number): number => {
  const gstop = 10 ** (0.1 * req.stopbandAttenuationDb);
  const gpass = 10 ** (0.1 * req.passbandRippleDb);
  return Math.ceil(Math.acosh(Math.sqrt((gstop - 1) / (gpass - 1))) / Math.acosh(nat));
};

/** scipy.signal.cheb1ord: the natural frequency is the (possibly moved) passband edge. */
function cheb1ord(req: OrderRequirement): OrderEstimate {
  const { passb, nat } = selectivity(req, "cheby");
  return { order: chebyshevOrder(req, nat), cutoffHz: unwarp(req, passb) };
}

/** scipy.signal.cheb2ord: the natural frequency is where the attenuation is first reached. */
function cheb2ord(req: OrderRequirement): OrderEstimate {
  const { passb, nat } = selectivity(req, "cheby");
  const order = chebyshevOrder(req, nat);
  const gstop = 10 ** (0.1 * req.stopbandAttenuationDb);
  const gpass = 10 ** (0.1 * req.passbandRippleDb);
  const newFreq = 1 / Math.cosh((1 / order) * Math.acosh(Math.sqrt((gstop - 1) / (gpass - 1))));
  const [p0, p1] = [passb[0], passb[1]];
  let wn: number[];
  if (req.response === "lowpass") wn = [p0 / newFreq];
  else if (req.response === "highpass") wn = [p0 * newFreq];
  else if (req.response === "bandstop") {
    const n0 = (newFreq / 2) * (p0 - p1) + Math.sqrt((newFreq ** 2 * (p1 - p0) ** 2) / 4 + p1 * p0);
    wn = [n0, (p1 * p0) / n0];
  } else {
    const n0 = (1 / (2 * newFreq)) * (p0 - p1) + Math.sqrt((p1 - p0) ** 2 / (4 * newFreq ** 2) + p1 * p0);
    wn = [n0, (p0 * p1) / n0];
  }
  return { order, cutoffHz: unwarp(req, wn) };
}

/** scipy.signal.ellipord: degree equation K(1/nat)K'(k1)/(K'(1/nat)K(k1)); natural frequency = passband edge. */
function ellipord(req: OrderRequirement): OrderEstimate {
  const { passb, nat } = selectivity(req, "ellip");
  const arg1Sq = pow10m1(0.1 * req.passbandRippleDb) / pow10m1(0.1 * req.stopbandAttenuationDb);
  const arg0 = 1 / nat;
  const order = Math.ceil((ellipK(arg0 ** 2) * ellipKm1(arg1Sq)) / (ellipKm1(arg0 ** 2) * ellipK(arg1Sq)));
  return { order, cutoffHz: unwarp(req, passb) };
}

/** Prototype frequency (rad/s) where the phase-normalised Bessel low-pass has lost `lossDb` (monotone). */
function besselLossFrequency(order: number, lossDb: number): number {
  const { poles } = besselap(order, "phase");
  const excessDb = (w: number) => poles.reduce((acc, p) => acc + 20 * Math.log10(cAbs(cSub([0, w], p))), 0) - lossDb;
  let lo = 0;
  let hi = 1;
  while (excessDb(hi) < 0) hi *= 2;
  for (let i = 0; i < 200 && hi - lo > Number.EPSILON * hi; i++) {
    const mid = (lo + hi) / 2;
    if (excessDb(mid) < 0) lo = mid;
    else hi = mid;
  }
  return (lo + hi) / 2;
}

/**
 * OUR OWN SEARCH (scipy has no besselord): the smallest order N whose phase-normalised Bessel design meets
 * the requirement. For each N the pass edge(s) are placed exactly at the ripple loss (the prototype frequency
 * ωp where the loss equals passbandRippleDb), which leaves the stopband as deep as it can be for that N, and
 * the order is accepted when the low-pass selectivity nat (as in scipy's *ord, without the band-stop edge
 * optimisation) reaches ωs/ωp, ωs being where the loss equals stopbandAttenuationDb. Exact for low/high-pass
 * and band-pass with the pass edges fixed; for band-stop it may ask one order more than strictly needed.
 */
function besselord(req: OrderRequirement): OrderEstimate {
  const nat = req.response === "bandstop" ? bandStopNat(req) : selectivity(req, "butter").nat;
  for (let order = 1; order <= MAX_ORDER[req.response]; order++) {
    const wp = besselLossFrequency(order, req.passbandRippleDb);
    const ws = besselLossFrequency(order, req.stopbandAttenuationDb);
    if (nat >= ws / wp) return { order, cutoffHz: besselCutoff(req, wp) };
  }
  return tooHigh(req, MAX_ORDER[req.response] + 1, "at least");
}

/** Band-stop selectivity with the pass edges fixed (no fminbound step). */
function bandStopNat(req: OrderRequirement): number {
  const t = (f: number) => Math.tan((Math.PI * f) / req.sampleRateHz);
  const [p0, p1] = list(req.passbandHz).map(t);
  return Math.min(...list(req.stopbandHz).map(t).map((s) => Math.abs((s * (p0 - p1)) / (s * s - p0 * p1))));
}

/** Critical frequencies that put the pass edge(s) of the prototype at ωp rad/s. */
function besselCutoff(req: OrderRequirement, wp: number): number | [number, number] {
  const passb = list(req.passbandHz).map((f) => Math.tan((Math.PI * f) / req.sampleRateHz));
  if (req.response === "lowpass") return unwarp(req, [passb[0] / wp]);
  if (req.response === "highpass") return unwarp(req, [passb[0] * wp]);
  const wo2 = passb[0] * passb[1];
  const bw = req.response === "bandpass" ? (passb[1] - passb[0]) / wp : (passb[1] - passb[0]) * wp;
  const upper = (bw + Math.sqrt(bw * bw + 4 * wo2)) / 2;
  return unwarp(req, [wo2 / upper, upper]);
}

function tooHigh(req: OrderRequirement, order: number, qualifier = ""): never {
  throw new Error(
    `${req.family} ${req.response} needs order ${qualifier ? `${qualifier} ` : ""}${order} for this requirement; ` +
      `the limit is ${MAX_ORDER[req.response]}${isBand(req.response) ? " per band edge" : ""} — widen the transition band or relax the ripple/attenuation`,
  );
}

/**
 * Lowest order and natural cutoff meeting a requirement, as scipy.signal buttord / cheb1ord / cheb2ord /
 * ellipord with fs (cutoff in Hz: a number for low/high-pass, a pair for band designs); Bessel uses our own
 * search (see besselord). Throws on an invalid requirement or when the order would exceed MAX_ORDER.
 */
export function estimateOrder(requirement: OrderRequirement): OrderEstimate {
  const parsed = orderRequirementSchema.safeParse(requirement);
  if (!parsed.success) {
    throw new Error(`invalid order requirement: ${parsed.error.issues.map((i) => `${i.path.join(".")}: ${i.message}`).join("; ")}`);
  }
  const req = parsed.data;
  const estimate =
    req.family === "butterworth" ? buttord(req)
    : req.family === "chebyshev1" ? cheb1ord(req)
    : req.family === "chebyshev2" ? cheb2ord(req)
    : req.family === "elliptic" ? ellipord(req)
    : besselord(req);
  if (!(estimate.order >= 1 && estimate.order <= MAX_ORDER[req.response])) tooHigh(req, estimate.order);
  return estimate;
}
