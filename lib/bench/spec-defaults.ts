import type { DiscretizationMethod, IirFamily, StageSpec } from "@/lib/dsp";
import { COMB_LIMITS } from "@/lib/dsp";

export const SPEC_KINDS = [
  "iir",
  "biquad",
  "fir",
  "moving-average",
  "differentiator",
  "ema",
  "analog",
  "coefficients",
  "notch",
  "comb",
  "fir-equiripple",
  "fir-arbitrary",
] as const;
export type SpecKind = (typeof SPEC_KINDS)[number];

export const KIND_LABELS: Record<SpecKind, string> = {
  iir: "IIR (classic families)",
  biquad: "Biquad (cookbook)",
  fir: "FIR (windowed sinc)",
  "moving-average": "Moving average",
  differentiator: "Differentiator",
  ema: "Exponential smoothing",
  analog: "Analog H(s)",
  coefficients: "Pasted coefficients",
  notch: "Notch / peak (bandwidth Q)",
  comb: "Comb (every harmonic)",
  "fir-equiripple": "FIR (equiripple)",
  "fir-arbitrary": "FIR (arbitrary magnitude)",
};

/** How each IIR family is named in the forms. */
export const FAMILY_LABELS: Record<IirFamily, string> = {
  butterworth: "Butterworth",
  chebyshev1: "Chebyshev I",
  chebyshev2: "Chebyshev II",
  elliptic: "Elliptic",
  bessel: "Bessel",
};

/** How each s→z discretisation method is named in the forms. */
export const METHOD_LABELS: Record<DiscretizationMethod, string> = {
  "forward-euler": "Forward Euler",
  "backward-euler": "Backward Euler",
  tustin: "Tustin (bilinear)",
  "tustin-prewarp": "Tustin with prewarping",
  zoh: "Zero-order hold",
  matched: "Matched z",
};

/** A round number of Hz near fraction·fs (at least 1 Hz), for starting values. */
const near = (fs: number, fraction: number) => Math.max(1, Math.round(fs * fraction));

/** A valid starting spec of each kind at sample rate fs (product choices, meant to be edited). */
export function defaultSpec(kind: SpecKind, fs: number): StageSpec {
  const sampleRateHz = fs;
  switch (kind) {
    case "iir":
      return { kind, family: "butterworth", response: "lowpass", order: 4, cutoffHz: near(fs, 0.1), sampleRateHz };
    case "biquad":
      return { kind, shape: "notch", centerHz: fs > 120 ? 50 : near(fs, 0.2), q: 30, sampleRateHz };
    case "fir":
      return { kind, response: "lowpass", window: "hamming", taps: 101, cutoffHz: near(fs, 0.1), sampleRateHz };
    case "moving-average":
      return { kind, length: 20, sampleRateHz };
    case "differentiator":
      return { kind, sampleRateHz };
    case "ema":
      return { kind, cutoffHz: near(fs, 0.02), sampleRateHz };
    case "analog": {
      const w = 2 * Math.PI * near(fs, 0.02);
      return { kind, num: [w * w], den: [1, 1.4 * w, w * w], method: "tustin", sampleRateHz };
    }
    case "coefficients":
      return { kind, b: [0.25, 0.5, 0.25], a: [1], sampleRateHz };
    case "notch":
      return { kind, shape: "notch", centerHz: fs > 120 ? 50 : near(fs, 0.2), q: 30, sampleRateHz };
    case "comb": {
      // The fundamental must divide fs: the whole number of samples nearest 50 Hz (at most the comb's limit).
      const delay = Math.min(COMB_LIMITS.maxCombOrder, Math.max(3, Math.round(fs / 50)));
      return { kind, shape: "notch", fundamentalHz: fs / delay, q: 30, sampleRateHz };
    }
    case "fir-equiripple":
      return { kind, taps: 51, bandsHz: [0, near(fs, 0.1), near(fs, 0.15), fs / 2], desired: [1, 0], weights: [1, 1], sampleRateHz };
    case "fir-arbitrary":
      return { kind, taps: 101, freqsHz: [0, near(fs, 0.1), near(fs, 0.15), fs / 2], gains: [1, 1, 0, 0], window: "hamming", sampleRateHz };
  }
}
