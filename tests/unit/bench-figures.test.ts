import { describe, expect, it } from "vitest";
import { candidateFigures } from "@/lib/bench/figures";
import { seedStage } from "@/lib/bench/chain-edit";
import { specSummary } from "@/lib/bench/spec-text";
import { attenuationDb, cutoffPoints, designFilter, frequencyResponse, stability, stepMetrics, toMs, type FilterSpec } from "@/lib/dsp";

const fs = 1000;
const butter2: FilterSpec = { kind: "iir", family: "butterworth", response: "lowpass", order: 2, cutoffHz: 100, sampleRateHz: fs };
const butter4: FilterSpec = { kind: "iir", family: "butterworth", response: "lowpass", order: 4, cutoffHz: 120, sampleRateHz: fs };
const notch: FilterSpec = { kind: "biquad", shape: "notch", centerHz: 50, q: 30, sampleRateHz: fs };
const fir: FilterSpec = { kind: "fir", response: "lowpass", window: "hamming", taps: 101, cutoffHz: 100, sampleRateHz: fs };

describe("comparison table figures", () => {
  it("match lib/dsp computed directly for a Butterworth LP 4", () => {
    const design = designFilter(butter4);
    const f = candidateFigures(design, { noiseLineHz: 240, delayAtHz: 60 });
    const r = frequencyResponse(design, [0, 60]);
    const step = stepMetrics(design);
    expect(f.order).toBe(4);
    expect(f.sections).toBe(2);
    expect(f.taps).toBeNull();
    expect(f.cutoffHz).toEqual(cutoffPoints(design));
    expect(f.cutoffHz[0]).toBeCloseTo(120, 6);
    expect(f.attenuationAtNoiseDb).toBe(attenuationDb(design, [240])[0]);
    expect(f.delayDcSamples).toBe(r.groupDelaySamples[0]);
    expect(f.delayDcMs).toBe(toMs(r.groupDelaySamples[0], fs));
    expect(f.delayAtSamples).toBe(r.groupDelaySamples[1]);
    expect(f.overshootPercent).toBe(step.overshootPercent);
    expect(f.settlingTimeS).toBe(step.settlingTimeS);
    expect(f.maxPoleRadius).toBe(stability(design).maxPoleRadius);
    expect(f.stable).toBe(true);
  });

  it("give the low-frequency delay of a 2nd-order 100 Hz Butterworth at 1 kHz that its analog prototype predicts", () => {
    // The analog prototype's DC group delay is Σ −Re(p_k)/|p_k|² = 1/(ωc·sin(π/2N)) = √2/ωc = 2.25 ms for N = 2 at
    // 100 Hz (from the pole positions; common practice), 2.25 samples at 1 kHz; the bilinear design is close to it.
    const f = candidateFigures(designFilter(butter2));
    expect(f.delayDcSamples).toBeCloseTo(2.2, 1);
    expect(f.delayDcMs).toBeCloseTo(2.2, 1);
  });

  it("count taps and the (N−1)/2 delay of a symmetric FIR", () => {
    // A symmetric N-tap FIR has generalized linear phase, delay (N−1)/2 samples (Oppenheim & Schafer,
    // Discrete-Time Signal Processing, 3rd ed., §5.7).
    const f = candidateFigures(designFilter(fir), { delayAtHz: 30 });
    expect(f.taps).toBe(101);
    expect(f.sections).toBeNull();
    expect(f.order).toBe(100);
    expect(f.delayDcSamples).toBeCloseTo(50, 9);
    expect(f.delayAtSamples).toBeCloseTo(50, 9);
    expect(f.maxPoleRadius).toBe(0);
  });

  it("attenuate a 50 Hz line deeply with a 50 Hz notch and leave the rest alone", () => {
    const f = candidateFigures(designFilter(notch), { noiseLineHz: 50 });
    expect(f.attenuationAtNoiseDb).toBeGreaterThan(100);
    expect(f.cutoffHz[0]).toBeLessThan(50);
    expect(f.cutoffHz[1]).toBeGreaterThan(50);
  });

  it("leave figures that need an input empty without it, or when it lies beyond Nyquist", () => {
    const f = candidateFigures(designFilter(butter2), { noiseLineHz: 900, delayAtHz: null });
    expect(f.attenuationAtNoiseDb).toBeNull();
    expect(f.delayAtMs).toBeNull();
  });
});

describe("candidate summaries and seeding", () => {
  it("read like the product notes", () => {
    expect(specSummary(butter4)).toBe("Butterworth LP 4 · 120 Hz");
    expect(specSummary(notch)).toBe("Notch biquad · 50 Hz, Q 30");
    expect(specSummary({ ...butter4, response: "bandstop", order: 2, cutoffHz: [45, 55] })).toBe("Butterworth BS 2 · 45 Hz–55 Hz");
    expect(specSummary({ kind: "moving-average", length: 20, sampleRateHz: fs })).toBe("Moving average · 20 samples");
  });

  it("seed a notch at a peak, or move a cutoff there", () => {
    expect(seedStage(null, 50.04, "notch", fs).spec).toEqual({ kind: "biquad", shape: "notch", centerHz: 50.04, q: 30, sampleRateHz: fs });
    expect(seedStage({ ...notch, q: 10 }, 150, "notch", fs).spec).toEqual({ kind: "chain", sampleRateHz: fs, stages: [{ ...notch, q: 10 }, { ...notch, centerHz: 150, q: 10 }] });
    expect(seedStage(butter4, 80, "cutoff", fs).spec).toEqual({ ...butter4, cutoffHz: 80 });
    expect(seedStage(notch, 80, "cutoff", fs).spec).toEqual({ kind: "chain", sampleRateHz: fs, stages: [notch, { ...butter4, cutoffHz: 80 }] });
  });
});
