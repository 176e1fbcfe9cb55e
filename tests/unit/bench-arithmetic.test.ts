import { describe, expect, it } from "vitest";
import { ARITHMETIC_TEST_SAMPLES, arithmeticCaution, arithmeticTestSignal, compareArithmetic } from "@/lib/bench/arithmetic";
import { designFilter, quantizeDesign, type FilterSpec } from "@/lib/dsp";
import { butter4 } from "./export-support";

const run = (spec: FilterSpec, format: "q15" | "q31", arithmetic: "tapwright" | "cmsis" | "cmsis-fast") => {
  const design = designFilter(spec);
  return compareArithmetic(design, quantizeDesign(design, format), arithmetic);
};

describe("the device's arithmetic against the float design (fixed-point view, set page)", () => {
  it("test signal: half-scale steps, then a half-scale chirp, never beyond ±0.5", () => {
    const x = arithmeticTestSignal();
    expect(x).toHaveLength(ARITHMETIC_TEST_SAMPLES);
    expect(x[0]).toBe(0.5);
    expect(x[ARITHMETIC_TEST_SAMPLES / 4]).toBe(-0.5);
    expect(Math.max(...x.map(Math.abs))).toBe(0.5);
  });

  it("a Q15 Butterworth low-pass stays within a few LSB of float in every arithmetic, with no caution", () => {
    for (const arithmetic of ["tapwright", "cmsis", "cmsis-fast"] as const) {
      const c = run(butter4, "q15", arithmetic);
      expect(c.overflows).toBe(0);
      // Common practice: coefficient rounding plus arithmetic noise of a 4th-order low-pass stays far below −60 dBFS.
      expect(c.worstDbfs).toBeLessThan(-60);
      expect(arithmeticCaution(c)).toBeNull();
    }
    expect(run(butter4, "q15", "cmsis").label).toMatch(/^CMSIS-DSP arm_biquad_cascade_df1_q15/);
  });

  it("a 5 Hz low-pass at 1 kHz strays in Q15 (tiny b words, poles near 1): the caution names the arithmetic and the size", () => {
    // Common practice: DF1 sections with a cutoff far below fs lose most of their numerator precision in Q15.
    const lowCut: FilterSpec = { kind: "iir", family: "butterworth", response: "lowpass", order: 2, cutoffHz: 5, sampleRateHz: 1000 };
    const c = run(lowCut, "q15", "cmsis");
    expect(c.worstDbfs).toBeGreaterThan(-60);
    const caution = arithmeticCaution(c);
    expect(caution?.kind).toBe("arithmetic");
    expect(caution?.text).toContain("Run in CMSIS-DSP arm_biquad_cascade_df1_q15");
    expect(caution?.text).toMatch(/by up to -\d+\.\d dBFS \(\d+ LSB\)/);
    // Q31 keeps the same filter close to float.
    expect(arithmeticCaution(run(lowCut, "q31", "cmsis"))).toBeNull();
  });
});
