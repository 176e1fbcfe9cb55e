import { activeStages, type FilterSpec, type StageSpec } from "@/lib/dsp";
import { hz, withUnit } from "./format";
import { FAMILY_LABELS } from "./spec-defaults";
import { countOf } from "@/lib/format/plural";

const RESPONSE: Record<string, string> = { lowpass: "LP", highpass: "HP", bandpass: "BP", bandstop: "BS" };
const METHOD: Record<string, string> = {
  "forward-euler": "forward Euler",
  "backward-euler": "backward Euler",
  tustin: "Tustin",
  "tustin-prewarp": "Tustin, prewarped",
  zoh: "zero-order hold",
  matched: "matched z",
};

const band = (f: number | [number, number]) => (typeof f === "number" ? hz(f) : `${hz(f[0])}–${hz(f[1])}`);
const capital = (s: string) => s.charAt(0).toUpperCase() + s.slice(1);

/**
 * One line that names a candidate, e.g. "Butterworth LP 4 · 120 Hz", "Notch biquad · 50 Hz, Q 30", or
 * for a chain its running stages joined by " → ".
 */
export function specSummary(spec: FilterSpec): string {
  if (spec.kind !== "chain") return stageSummary(spec);
  const running = activeStages(spec);
  const bypassed = spec.stages.length - running.length;
  const line = running.map((s) => stageSummary(s.spec)).join(" → ");
  return bypassed > 0 ? `${line} (${bypassed} bypassed)` : line;
}

/** One line that names a single stage. */
export function stageSummary(spec: StageSpec): string {
  switch (spec.kind) {
    case "iir":
      return `${FAMILY_LABELS[spec.family]} ${RESPONSE[spec.response]} ${spec.order} · ${band(spec.cutoffHz)}`;
    case "biquad": {
      const gain = spec.gainDb === undefined ? "" : `, ${withUnit(spec.gainDb, "dB")}`;
      return `${capital(spec.shape)} biquad · ${hz(spec.centerHz)}, Q ${withUnit(spec.q, "")}${gain}`;
    }
    case "fir":
      return `FIR ${RESPONSE[spec.response]} ${spec.taps} taps · ${capital(spec.window)} · ${band(spec.cutoffHz)}`;
    case "moving-average":
      return `Moving average · ${countOf(spec.length, "sample")}`;
    case "differentiator":
      return "Differentiator · first difference";
    case "ema":
      return `Exponential smoothing · ${hz(spec.cutoffHz)}`;
    case "analog":
      return `Analog H(s) order ${spec.den.length - 1} · ${METHOD[spec.method]}`;
    case "fir-equiripple":
      return `Equiripple FIR ${spec.taps} taps · ${countOf(spec.desired.length, "band")}`;
    case "fir-arbitrary":
      return `Arbitrary FIR ${spec.taps} taps · ${capital(spec.window)} · ${countOf(spec.freqsHz.length, "point")}`;
    case "notch":
      return `${capital(spec.shape)} · ${hz(spec.centerHz)}, Q ${withUnit(spec.q, "")} (−3 dB width ${hz(spec.centerHz / spec.q)})`;
    case "comb":
      return `Comb ${spec.shape} · ${hz(spec.fundamentalHz)} and harmonics, Q ${withUnit(spec.q, "")}`;
    case "coefficients":
      return spec.sos ? `Pasted SOS · ${countOf(spec.sos.length, "section")}` : `Pasted b/a · ${spec.b?.length ?? 0}/${spec.a?.length ?? 1} coefficients`;
  }
}

/** The frequencies in Hz a spec is designed at (cutoffs, centre, prewarp), for the Nyquist check. */
export function specFrequencies(spec: FilterSpec): number[] {
  switch (spec.kind) {
    case "chain":
      return activeStages(spec).flatMap((s) => specFrequencies(s.spec));
    case "iir":
    case "fir":
      return typeof spec.cutoffHz === "number" ? [spec.cutoffHz] : [...spec.cutoffHz];
    case "biquad":
    case "notch":
      return [spec.centerHz];
    case "comb":
      return [spec.fundamentalHz];
    case "ema":
      return [spec.cutoffHz];
    case "analog":
      return spec.prewarpHz === undefined ? [] : [spec.prewarpHz];
    default:
      return [];
  }
}

/**
 * The bands a spec rejects, in Hz, one per running stage that rejects one: a notch biquad (−3 dB width
 * f0/Q) or a band-stop IIR/FIR.
 */
export function notchBands(spec: FilterSpec): [number, number][] {
  return activeStages(spec).flatMap(({ spec: s }): [number, number][] => {
    if (s.kind === "biquad" && s.shape === "notch") {
      const half = s.centerHz / s.q / 2;
      return [[s.centerHz - half, s.centerHz + half]];
    }
    if ((s.kind === "iir" || s.kind === "fir") && s.response === "bandstop" && typeof s.cutoffHz !== "number") return [[s.cutoffHz[0], s.cutoffHz[1]]];
    return [];
  });
}
