import { describe, expect, it } from "vitest";
import { filterSpecSchema } from "@/lib/dsp/filter-spec";

/** Issues of a refused spec as "path → message"; fails when the spec is accepted. */
function refusals(spec: unknown): Map<string, string> {
  const r = filterSpecSchema.safeParse(spec);
  expect(r.success, `accepted ${JSON.stringify(spec)}`).toBe(false);
  return new Map((r.error?.issues ?? []).map((i) => [i.path.join("."), i.message]));
}

function expectRefused(spec: unknown, path: string, message: RegExp): void {
  const issues = refusals(spec);
  expect([...issues.keys()]).toContain(path);
  expect(issues.get(path)).toMatch(message);
}

const fs = 1000;
const biquad = { kind: "biquad", shape: "lowpass", centerHz: 100, q: 0.7, sampleRateHz: fs };
const fir = { kind: "fir", response: "lowpass", window: "hann", taps: 31, cutoffHz: 100, sampleRateHz: fs };
const analog = { kind: "analog", num: [1], den: [1, 10], method: "tustin", sampleRateHz: fs };

describe("valid specs of every kind are accepted", () => {
  it.each([
    biquad,
    { ...biquad, shape: "peaking", gainDb: -6 },
    fir,
    { ...fir, response: "bandstop", window: "kaiser", taps: 31, cutoffHz: [100, 200], stopbandAttenuationDb: 60 },
    { kind: "moving-average", length: 20, sampleRateHz: fs },
    { kind: "differentiator", sampleRateHz: fs },
    { kind: "ema", cutoffHz: 10, sampleRateHz: fs },
    analog,
    { ...analog, method: "tustin-prewarp", prewarpHz: 50 },
    { kind: "coefficients", b: [1, 2, 1], a: [1, -0.5, 0.25], sampleRateHz: fs },
    { kind: "coefficients", sos: [[1, 2, 1, 1, -0.5, 0.25]], sampleRateHz: fs },
    { kind: "iir", family: "butterworth", response: "lowpass", order: 4, cutoffHz: 100, sampleRateHz: fs },
  ])("%o", (spec) => {
    expect(filterSpecSchema.safeParse(spec).success).toBe(true);
  });
});

describe("refusals name the field and the allowed range", () => {
  it("unknown kind", () => expectRefused({ kind: "magic", sampleRateHz: fs }, "kind", /Expected 'iir' \| 'biquad'/));
  it("sampleRateHz ≤ 0, NaN or Infinity", () => {
    expectRefused({ ...biquad, sampleRateHz: 0 }, "sampleRateHz", /finite number above 0 Hz/);
    expectRefused({ ...biquad, sampleRateHz: NaN }, "sampleRateHz", /must be a finite number/);
    expectRefused({ kind: "differentiator", sampleRateHz: Infinity }, "sampleRateHz", /must be a finite number/);
  });

  describe("biquad", () => {
    it("centerHz at or above Nyquist, or ≤ 0", () => {
      expectRefused({ ...biquad, centerHz: 500 }, "centerHz", /must be above 0 Hz and below half the sample rate \(500 Hz\) \(got 500 Hz\)/);
      expectRefused({ ...biquad, centerHz: -1 }, "centerHz", /above 0 Hz and below half the sample rate/);
    });
    it("q ≤ 0, too large, or not finite", () => {
      expectRefused({ ...biquad, q: 0 }, "q", /Q must be above 0 and at most 1000 \(got 0\)/);
      expectRefused({ ...biquad, q: 5000 }, "q", /at most 1000/);
      expectRefused({ ...biquad, q: Infinity }, "q", /Q must be a finite number/);
    });
    it("gainDb missing for peaking/shelves, out of range, or given to a shape that ignores it", () => {
      expectRefused({ ...biquad, shape: "lowshelf" }, "gainDb", /required for a lowshelf biquad \(−60 to 60 dB\)/);
      expectRefused({ ...biquad, shape: "peaking", gainDb: 80 }, "gainDb", /from −60 to 60 dB \(got 80 dB\)/);
      expectRefused({ ...biquad, gainDb: 3 }, "gainDb", /only used by peaking, lowshelf, highshelf/);
    });
    it("unknown shape", () => expectRefused({ ...biquad, shape: "comb" }, "shape", /lowpass/));
  });

  describe("fir", () => {
    it("taps outside 1..1023 or not an integer", () => {
      expectRefused({ ...fir, taps: 0 }, "taps", /whole number from 1 to 1023 \(got 0\)/);
      expectRefused({ ...fir, taps: 1024 }, "taps", /whole number from 1 to 1023/);
      expectRefused({ ...fir, taps: 10.5 }, "taps", /whole number from 1 to 1023/);
    });
    it("2 taps with hann or blackman (0 at both ends)", () => {
      expectRefused({ ...fir, taps: 2 }, "taps", /1 or at least 3 for the hann window/);
      expectRefused({ ...fir, window: "blackman", taps: 2 }, "taps", /1 or at least 3 for the blackman window/);
    });
    it("even taps for highpass and bandstop", () => {
      expectRefused({ ...fir, response: "highpass", taps: 30 }, "taps", /odd for a highpass/);
      expectRefused({ ...fir, response: "bandstop", taps: 30, cutoffHz: [100, 200] }, "taps", /odd for a bandstop/);
    });
    it("cutoffs at Nyquist, the wrong shape, or not increasing", () => {
      expectRefused({ ...fir, cutoffHz: 500 }, "cutoffHz", /above 0 Hz and below half the sample rate \(500 Hz\)/);
      expectRefused({ ...fir, cutoffHz: [100, 200] }, "cutoffHz", /single frequency for a lowpass/);
      expectRefused({ ...fir, response: "bandpass", cutoffHz: 100 }, "cutoffHz", /pair \[low, high\]/);
      expectRefused({ ...fir, response: "bandpass", cutoffHz: [200, 100] }, "cutoffHz", /low edge must be below the high edge/);
      expectRefused({ ...fir, cutoffHz: NaN }, "cutoffHz", /frequency in Hz/);
    });
    it("kaiser needs exactly one of kaiserBeta and stopbandAttenuationDb, in range; other windows take neither", () => {
      expectRefused({ ...fir, window: "kaiser" }, "kaiserBeta", /exactly one of Kaiser β and the stopband attenuation/);
      expectRefused({ ...fir, window: "kaiser", kaiserBeta: 5, stopbandAttenuationDb: 60 }, "kaiserBeta", /exactly one/);
      expectRefused({ ...fir, window: "kaiser", kaiserBeta: -1 }, "kaiserBeta", /from 0 to 100 \(got -1\)/);
      expectRefused({ ...fir, window: "kaiser", stopbandAttenuationDb: 0 }, "stopbandAttenuationDb", /above 0 dB and at most 300 dB/);
      expectRefused({ ...fir, kaiserBeta: 5 }, "kaiserBeta", /only used by the Kaiser window/);
    });
  });

  it("moving-average length outside 1..2048", () => {
    expectRefused({ kind: "moving-average", length: 0, sampleRateHz: fs }, "length", /whole number from 1 to 2048 \(got 0\)/);
    expectRefused({ kind: "moving-average", length: 2049, sampleRateHz: fs }, "length", /1 to 2048/);
    expectRefused({ kind: "moving-average", length: 2.5, sampleRateHz: fs }, "length", /whole number/);
  });

  it("ema cutoff at or above Nyquist", () => {
    expectRefused({ kind: "ema", cutoffHz: 500, sampleRateHz: fs }, "cutoffHz", /above 0 Hz and below half the sample rate \(500 Hz\)/);
  });

  describe("analog", () => {
    it("empty, all-zero, non-finite or too long polynomials", () => {
      expectRefused({ ...analog, num: [] }, "num", /at least 1 coefficient/);
      expectRefused({ ...analog, den: [0, 0] }, "den", /nonzero coefficient/);
      expectRefused({ ...analog, num: [0] }, "num", /nonzero coefficient/);
      expectRefused({ ...analog, den: [1, NaN] }, "den.1", /The denominator a\(s\): every coefficient must be a finite number/);
      expectRefused({ ...analog, den: new Array(22).fill(1) }, "den", /at most 21 coefficients/);
    });
    it("improper H(s)", () => expectRefused({ ...analog, num: [1, 0, 0] }, "num", /proper: the numerator has degree 2, more than the denominator.s 1/));
    it("prewarpHz missing or at Nyquist for tustin-prewarp; refused for other methods", () => {
      expectRefused({ ...analog, method: "tustin-prewarp" }, "prewarpHz", /required for Tustin with prewarping \(above 0 Hz and below half the sample rate \(500 Hz\)\)/);
      expectRefused({ ...analog, method: "tustin-prewarp", prewarpHz: 500 }, "prewarpHz", /above 0 Hz and below half the sample rate \(500 Hz\)/);
      expectRefused({ ...analog, method: "zoh", prewarpHz: 50 }, "prewarpHz", /only used by Tustin with prewarping/);
    });
    it("unknown method", () => expectRefused({ ...analog, method: "impulse" }, "method", /zoh/));
  });

  describe("coefficients", () => {
    const base = { kind: "coefficients", sampleRateHz: fs };
    it("neither b nor sos, or both", () => {
      expectRefused(base, "b", /b \(numerator\) is required, with a \(denominator\) if any, unless SOS rows are given/);
      expectRefused({ ...base, b: [1], sos: [[1, 0, 0, 1, 0, 0]] }, "b", /either b \(and a\) or SOS rows/);
      expectRefused({ ...base, a: [1, 0.5], sos: [[1, 0, 0, 1, 0, 0]] }, "a", /either b \(and a\) or SOS rows/);
    });
    it("a0 = 0, all-zero b, empty lists", () => {
      expectRefused({ ...base, b: [1], a: [0, 1] }, "a.0", /a0, must be nonzero/);
      expectRefused({ ...base, b: [0, 0] }, "b", /nonzero coefficient/);
      expectRefused({ ...base, b: [] }, "b", /at least 1 coefficient/);
    });
    it("sos rows: six numbers, a0 ≠ 0, a nonzero numerator, 1..32 rows", () => {
      expectRefused({ ...base, sos: [[1, 2, 1, 1, 0.5]] }, "sos.0", /6 numbers \[b0, b1, b2, a0, a1, a2\]/);
      expectRefused({ ...base, sos: [[1, 2, 1, 1, 0, 0], [1, 0, 0, 0, 1, 0]] }, "sos.1.3", /a0 = 0/);
      expectRefused({ ...base, sos: [[0, 0, 0, 1, 0, 0]] }, "sos.0", /all-zero numerator/);
      expectRefused({ ...base, sos: [] }, "sos", /at least 1 SOS row/);
      expectRefused({ ...base, sos: [[1, Infinity, 0, 1, 0, 0]] }, "sos.0.1", /finite number/);
    });
  });

  it("iir specs are checked by the IIR schema (order range)", () => {
    expectRefused({ kind: "iir", family: "butterworth", response: "lowpass", order: 0, cutoffHz: 100, sampleRateHz: fs }, "order", /1 to 12/);
  });
});
