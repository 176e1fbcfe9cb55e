import { describe, expect, it } from "vitest";
import { tryDesign } from "@/lib/bench/candidates";
import { filterSpecSchema, orderRequirementSchema, type FilterSpec } from "@/lib/dsp";
import { firOrderRequirementSchema } from "@/lib/dsp/fir/kaiser-order";

const fs = 1000;
/** A camelCase identifier (cutoffHz, sampleRateHz, passbandRippleDb…): lowercase letters, then a capitalised word; units such as dB do not count. */
const IDENTIFIER = /\b[a-z]+[A-Z][a-z]+[A-Za-z]*\b/;

const BAD_SPECS: unknown[] = [
  { kind: "iir", family: "butterworth", response: "lowpass", order: 4, cutoffHz: 600, sampleRateHz: fs },
  { kind: "iir", family: "butterworth", response: "bandpass", order: 9, cutoffHz: [80, 40], sampleRateHz: fs },
  { kind: "iir", family: "elliptic", response: "lowpass", order: 4, cutoffHz: 100, sampleRateHz: fs },
  { kind: "iir", family: "butterworth", response: "lowpass", order: NaN, cutoffHz: NaN, sampleRateHz: 0 },
  { kind: "biquad", shape: "peaking", centerHz: 700, q: 0, sampleRateHz: fs },
  { kind: "notch", shape: "notch", centerHz: 400, q: 0.5, sampleRateHz: fs },
  { kind: "comb", shape: "notch", fundamentalHz: 33, q: 30, sampleRateHz: fs },
  { kind: "fir", response: "highpass", window: "kaiser", taps: 30, cutoffHz: 500, sampleRateHz: fs },
  { kind: "fir", response: "lowpass", window: "hamming", taps: 31, cutoffHz: 100, kaiserBeta: 5, stopbandAttenuationDb: 60, sampleRateHz: fs },
  { kind: "fir-equiripple", taps: 32, bandsHz: [10, 100, 150, 400], desired: [0, 1], sampleRateHz: fs },
  { kind: "fir-arbitrary", taps: 31, window: "kaiser", kaiserBeta: 500, freqsHz: [10, 400], gains: [1], sampleRateHz: fs },
  { kind: "moving-average", length: 0, sampleRateHz: fs },
  { kind: "ema", cutoffHz: 500, sampleRateHz: fs },
  { kind: "analog", num: [1, 0, 0], den: [1, 1], method: "tustin-prewarp", sampleRateHz: fs },
  { kind: "analog", num: [0], den: [1, NaN], method: "zoh", prewarpHz: 50, sampleRateHz: fs },
  { kind: "coefficients", b: [1], a: [0, 1], sampleRateHz: fs },
  { kind: "coefficients", sos: [[0, 0, 0, 0, 1, 0]], b: [1], sampleRateHz: fs },
  { kind: "chain", sampleRateHz: fs, stages: [{ spec: { kind: "notch", shape: "notch", centerHz: 600, q: 30, sampleRateHz: fs } }] },
];

describe("refusals speak the editor's words", () => {
  it.each(BAD_SPECS.map((s, i) => [i, s] as const))("bad spec %i: every message shown is free of field identifiers", (_i, spec) => {
    const parsed = filterSpecSchema.safeParse(spec);
    expect(parsed.success).toBe(false);
    const shown = tryDesign(spec as FilterSpec).error ?? "";
    expect(shown).not.toBe("");
    for (const message of [...(parsed.error?.issues ?? []).map((i) => i.message), shown]) {
      expect(message, message).not.toMatch(IDENTIFIER);
      expect(message).not.toContain("sampleRateHz/2");
    }
  });

  it("word a cutoff above Nyquist as the editor labels it, with half the sample rate in Hz", () => {
    const spec = BAD_SPECS[0] as FilterSpec;
    expect(tryDesign(spec).error).toBe("The cutoff must be above 0 Hz and below half the sample rate (500 Hz) (got 600 Hz)");
  });

  it("word the order requirements' refusals the same way", () => {
    const iir = orderRequirementSchema.safeParse({ family: "butterworth", response: "lowpass", passbandHz: 100, stopbandHz: 50, passbandRippleDb: 0, stopbandAttenuationDb: 40, sampleRateHz: fs });
    const fir = firOrderRequirementSchema.safeParse({ rippleDb: 4, widthHz: 600, sampleRateHz: fs });
    const messages = [...(iir.error?.issues ?? []), ...(fir.error?.issues ?? [])].map((i) => i.message);
    expect(messages.length).toBeGreaterThanOrEqual(4);
    for (const m of messages) expect(m, m).not.toMatch(IDENTIFIER);
  });
});
