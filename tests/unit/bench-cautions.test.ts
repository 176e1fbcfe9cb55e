import { describe, expect, it } from "vitest";
import { CAUTION_LIMITS, cautionsFor, highestLevel, onOrOutsideUnitCircle, phaseLagDeg, quantizationImpact, REVIEW_LINE } from "@/lib/bench/cautions";
import { defaultSpec } from "@/lib/bench/spec-defaults";
import { designFilter, quantizeDesign, type FilterSpec } from "@/lib/dsp";

const fs = 1000;
const kinds = (spec: FilterSpec, deviceFormat: "f32" | "q15" | "q31" = "f32", crossoverHz: number | null = null) =>
  cautionsFor({ spec, design: designFilter(spec), deviceFormat, crossoverHz }).map((c) => c.kind);

describe("cautions", () => {
  it("end with the line that defers to review, safety documentation and local codes", () => {
    expect(REVIEW_LINE).toBe("Confirm with your team's review and the machine's safety documentation; local codes and licensed engineers decide.");
  });

  it("say nothing for a short moving average", () => {
    expect(kinds({ kind: "moving-average", length: 3, sampleRateHz: fs }, "q15")).toEqual([]);
  });

  it("flag poles within 1 % of the unit circle and a notch that may hide a fault", () => {
    // A 50 Hz notch with Q 30 at 1 kHz has its poles at r ≈ 1 − π·f0/(Q·fs) ≈ 0.9948 (common practice).
    const spec: FilterSpec = { kind: "biquad", shape: "notch", centerHz: 50, q: 30, sampleRateHz: fs };
    const found = cautionsFor({ spec, design: designFilter(spec), deviceFormat: "f32" });
    expect(found.map((c) => c.kind)).toEqual(["poles", "notch"]);
    expect(found[0].text).toContain("0.9949");
    expect(found[1].text).toContain("49.17 Hz–50.83 Hz");
  });

  it("flag an integrator (b = 1, a = 1, −1; its pole sits at z = 1) as marginal, in red, and nothing that needs it to settle", () => {
    // The pole of 1/(1 − z⁻¹) is z = 1 (Oppenheim & Schafer, Discrete-Time Signal Processing, 3rd ed., §3.3: from memory).
    const spec: FilterSpec = { kind: "coefficients", b: [1], a: [1, -1], sampleRateHz: fs };
    const found = cautionsFor({ spec, design: designFilter(spec), deviceFormat: "q15", crossoverHz: 5 });
    expect(found.map((c) => [c.kind, c.level, c.title])).toEqual([["poles", "danger", "Marginally stable filter"]]);
  });

  it("flag a pole outside the unit circle as unstable, in red, and a pole a rounding error short of it as marginal", () => {
    const outside: FilterSpec = { kind: "coefficients", b: [1], a: [1, -1.01], sampleRateHz: fs };
    expect(cautionsFor({ spec: outside, design: designFilter(outside), deviceFormat: "f32" }).map((c) => [c.level, c.title])).toEqual([["danger", "Unstable filter"]]);
    expect(onOrOutsideUnitCircle(1 - 1e-12)).toBe(true);
    expect(onOrOutsideUnitCircle(0.9999)).toBe(false);
  });

  it("give levels: a pole near the circle and a notch amber, the loop delay without a crossover a quiet note", () => {
    const notch: FilterSpec = { kind: "biquad", shape: "notch", centerHz: 50, q: 30, sampleRateHz: fs };
    expect(cautionsFor({ spec: notch, design: designFilter(notch), deviceFormat: "f32" }).map((c) => c.level)).toEqual(["warning", "warning"]);
    const slow: FilterSpec = { kind: "moving-average", length: 200, sampleRateHz: fs };
    expect(cautionsFor({ spec: slow, design: designFilter(slow), deviceFormat: "f32" }).map((c) => [c.kind, c.level])).toEqual([["loop", "note"]]);
  });

  it("flag a quantization to the device format that moves the response by more than 1 dB", () => {
    const spec: FilterSpec = { kind: "iir", family: "butterworth", response: "lowpass", order: 8, cutoffHz: 2, sampleRateHz: fs };
    expect(kinds(spec, "q15")).toContain("quantization");
    expect(kinds(spec, "q31")).not.toContain("quantization");
  });

  it("flag a cutoff above 0.45·fs", () => {
    const spec: FilterSpec = { kind: "iir", family: "butterworth", response: "lowpass", order: 2, cutoffHz: 460, sampleRateHz: fs };
    expect(kinds(spec)).toContain("nyquist");
    expect(kinds({ ...spec, cutoffHz: CAUTION_LIMITS.nyquistFraction * fs })).not.toContain("nyquist");
  });

  it("state the delay and the phase it costs at the loop crossover", () => {
    const spec: FilterSpec = { kind: "iir", family: "butterworth", response: "lowpass", order: 2, cutoffHz: 100, sampleRateHz: fs };
    expect(kinds(spec, "f32", 5)).not.toContain("loop");
    const loop = cautionsFor({ spec, design: designFilter(spec), deviceFormat: "f32", crossoverHz: 30 }).find((c) => c.kind === "loop");
    expect(loop?.text).toMatch(/delays the signal by about 2\.\d+ ms and costs \d+° of phase at the 30 Hz crossover/);
    // Without a crossover, a delay of ≥ 2 ms asks for one.
    expect(cautionsFor({ spec, design: designFilter(spec), deviceFormat: "f32" }).find((c) => c.kind === "loop")?.text).toMatch(/enter the loop's crossover/);
  });

  it("measure the phase lag of a 2nd-order Butterworth at a tenth of its corner as its closed form gives", () => {
    // H(s) = 1/(s² + √2·s + 1) lags atan(√2·x/(1 − x²)) at x = f/fc (S. Butterworth, “On the Theory of Filter Amplifiers”, Experimental Wireless & the Wireless Engineer, vol. 7, 1930): 8.13° at x = 0.1; at
    // fs = 1 MHz the bilinear warping at 1 kHz is negligible.
    const design = designFilter({ kind: "iir", family: "butterworth", response: "lowpass", order: 2, cutoffHz: 1000, sampleRateHz: 1e6 });
    expect(phaseLagDeg(design, 100)).toBeCloseTo(8.1, 1);
  });

  it("judge quantization in the passband and against the stopband limit, not deep in the stopband", () => {
    // The default windowed-sinc FIR (Hamming, 101 taps): its stopband near −53 dB moves by more than 1 dB in Q15,
    // yet stays far below the 40 dB limit, and its passband barely moves.
    const fir = defaultSpec("fir", fs);
    const design = designFilter(fir);
    const q = quantizeDesign(design, "q15");
    expect(q.maxDeviationDb).toBeGreaterThan(CAUTION_LIMITS.quantizationDb);
    const impact = quantizationImpact(fir, design, q);
    expect(impact.passbandDeviationDb).toBeLessThan(CAUTION_LIMITS.quantizationDb);
    expect(impact.stopbandLimitDb).toBe(40);
    expect(impact.stopbandLevelDb).toBeLessThan(-40);
    expect(kinds(fir, "q15")).not.toContain("quantization");
  });

  it("keep a stated stopband attenuation as the limit, and name what moved", () => {
    const kaiser: FilterSpec = { kind: "fir", response: "lowpass", window: "kaiser", stopbandAttenuationDb: 60, taps: 101, cutoffHz: 100, sampleRateHz: fs };
    const design = designFilter(kaiser);
    expect(quantizationImpact(kaiser, design, quantizeDesign(design, "q31")).stopbandLimitDb).toBe(60);
    const slow: FilterSpec = { kind: "iir", family: "butterworth", response: "lowpass", order: 8, cutoffHz: 2, sampleRateHz: fs };
    const found = cautionsFor({ spec: slow, design: designFilter(slow), deviceFormat: "q15" }).find((c) => c.kind === "quantization");
    expect(found?.level).toBe("warning");
    expect(found?.text).toContain("the passband (within 3 dB of the peak) moves by up to");
  });

  it("give a card's badge the loudest level among its cautions", () => {
    expect(highestLevel([])).toBeNull();
    expect(highestLevel([{ level: "note" }])).toBe("note");
    expect(highestLevel([{ level: "note" }, { level: "warning" }])).toBe("warning");
    expect(highestLevel([{ level: "warning" }, { level: "danger" }, { level: "note" }])).toBe("danger");
    const slow: FilterSpec = { kind: "moving-average", length: 200, sampleRateHz: fs };
    expect(highestLevel(cautionsFor({ spec: slow, design: designFilter(slow), deviceFormat: "q15" }))).toBe("note");
  });
});
