import { buildRevisionContent } from "@/lib/coefficients";
import type { FilterSpec } from "@/lib/dsp";
import type { ExportSource, ExportTarget } from "@/lib/export";

/** An export source built the way a saved revision is (buildRevisionContent), for unit tests. */
export function sourceFor(spec: FilterSpec, storedFormat: ExportTarget = "q15", setName = "Torque LP"): ExportSource {
  const content = buildRevisionContent(spec, storedFormat);
  return {
    setId: 7,
    setName,
    revisionId: 41,
    revision: 3,
    channel: "gearbox-endurance/torque-node/input-torque",
    spec,
    design: content.design,
    storedFormat,
    storedQuantized: content.quantized,
    approval: { by: "Lena Lead", at: new Date("2026-11-30T09:15:00Z") },
  };
}

export const butter4: FilterSpec = { kind: "iir", family: "butterworth", response: "lowpass", order: 4, cutoffHz: 100, sampleRateHz: 1000 };

/** A resonant peak (+12 dB at 50 Hz, Q 8): full-scale input saturates Q15, which the C code must match. */
export const peak: FilterSpec = { kind: "biquad", shape: "peaking", centerHz: 50, q: 8, gainDb: 12, sampleRateHz: 1000 };

/** A chain with an FIR stage between sections: notch 50 Hz, 63-tap Hamming low-pass at 200 Hz, notch 150 Hz, Butterworth low-pass 4 at 300 Hz (1 kHz). */
export const chainWithFir: FilterSpec = {
  kind: "chain",
  sampleRateHz: 1000,
  stages: [
    { kind: "biquad", shape: "notch", centerHz: 50, q: 5, sampleRateHz: 1000 },
    { kind: "fir", response: "lowpass", window: "hamming", taps: 63, cutoffHz: 200, sampleRateHz: 1000 },
    { kind: "biquad", shape: "notch", centerHz: 150, q: 5, sampleRateHz: 1000 },
    { kind: "iir", family: "butterworth", response: "lowpass", order: 4, cutoffHz: 300, sampleRateHz: 1000 },
  ],
};

/** A chain with an asymmetric FIR (a pasted 5-tap minimum-phase-like smoother), so reversed taps would show; then a notch. */
export const chainAsymmetric: FilterSpec = {
  kind: "chain",
  sampleRateHz: 1000,
  stages: [
    { kind: "coefficients", b: [0.4, 0.3, 0.15, 0.1, 0.05], sampleRateHz: 1000 },
    { kind: "biquad", shape: "notch", centerHz: 50, q: 5, sampleRateHz: 1000 },
  ],
};
