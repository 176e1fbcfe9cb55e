import type { StoredCoefficients } from "@/lib/coefficients";
import { designFilter, designZeros, quantizeDesign, zpk2sos, type FilterSpec } from "@/lib/dsp";

/** The frame-strain fix from issue 10: notches at 50 Hz and 150 Hz, then a 4th-order Butterworth low-pass at 200 Hz (1 kHz). */
export const humChain: FilterSpec = {
  kind: "chain",
  sampleRateHz: 1000,
  stages: [
    { kind: "biquad", shape: "notch", centerHz: 50, q: 5, sampleRateHz: 1000 },
    { kind: "biquad", shape: "notch", centerHz: 150, q: 5, sampleRateHz: 1000 },
    { kind: "iir", family: "butterworth", response: "lowpass", order: 4, cutoffHz: 200, sampleRateHz: 1000 },
  ],
};

/** A 255-tap windowed-sinc low-pass at 1 kHz: more taps than sections could ever carry (at most 64 sections, 129 taps). */
export const firLowpass255: Extract<FilterSpec, { kind: "fir" }> = {
  kind: "fir",
  response: "lowpass",
  window: "hamming",
  taps: 255,
  cutoffHz: 100,
  sampleRateHz: 1000,
};

/**
 * A 31-tap FIR revision in the shape revisions were stored in before chains: the design keeps its
 * taps, the stored Q15 form is the FIR factored into second-order sections (zpk2sos of its zeros and
 * poles at the origin), quantized as sections.
 */
export function legacyFirRevision(): StoredCoefficients {
  const design = designFilter({ ...firLowpass255, taps: 31 });
  const sections = { ...design, taps: undefined, sos: zpk2sos(designZeros(design), design.poles, design.gain) };
  return { design, format: "q15", quantized: quantizeDesign(sections, "q15") };
}
