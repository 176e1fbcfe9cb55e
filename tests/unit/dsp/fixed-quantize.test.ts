import { describe, expect, it } from "vitest";
import { transferAt } from "@/lib/dsp/analysis/evaluate";
import { peakGainDb } from "@/lib/dsp/analysis/gain";
import { quantizeSections } from "@/lib/dsp/fixed/coefficient-quantizer";
import { assertDeployable } from "@/lib/dsp/fixed/deployable";
import { maxDeviationDb } from "@/lib/dsp/fixed/deviation";
import { compareStructures, quantizeDirectForm } from "@/lib/dsp/fixed/direct-form";
import { spreadGain } from "@/lib/dsp/fixed/gain-spreading";
import { quantizeDesign } from "@/lib/dsp/fixed/quantize-design";
import { designIir } from "@/lib/dsp/iir/design";
import type { FilterDesign } from "@/lib/dsp/types";

const butter = (order: number, cutoffHz: number, sampleRateHz = 1000): FilterDesign =>
  designIir({ kind: "iir", family: "butterworth", response: "lowpass", order, cutoffHz, sampleRateHz });

describe("quantizeDesign", () => {
  it("gives the Q15 words of scipy's butter(2, 100, fs=1000) scaled by 2^14 (post-shift 1), rounded", () => {
    // b = [0.067455, 0.134911, 0.067455], a = [1, −1.142981, 0.412802] × 16384 = 1105.19, 2210.37, 1105.19, −18726.59,
    // 6763.34 (scipy 1.10.1), rounded to nearest; firmware that adds the feedback terms stores a1, a2 negated.
    // Gain left in the single section.
    const d = butter(2, 100);
    expect(quantizeSections(d.sos ?? [], "q15")).toMatchObject({ integers: [[1105, 2210, 1105, -18727, 6763]], shifts: [1] });
    // One section: L∞ gain spreading leaves it unchanged, so quantizeDesign gives the same words.
    const q = quantizeDesign(d, "q15");
    expect(q.integers).toEqual([[1105, 2210, 1105, -18727, 6763]]);
    expect(q.sos?.[0]).toEqual([1105 / 16384, 2210 / 16384, 1105 / 16384, 1, -18727 / 16384, 6763 / 16384]);
    expect(q.stable).toBe(true);
  });

  it("spreads the gain: every partial cascade peaks at 1 and the whole response is unchanged", () => {
    const d = butter(8, 20);
    const spread = spreadGain(d.sos ?? [], 1000);
    for (let k = 1; k < spread.length; k++) {
      expect(peakGainDb({ ...d, sos: spread.slice(0, k) })).toBeCloseTo(0, 9);
    }
    const deviation = maxDeviationDb(
      (w) => transferAt([{ kind: "sos", sos: d.sos ?? [] }], w),
      (w) => transferAt([{ kind: "sos", sos: spread }], w),
    );
    expect(deviation).toBeLessThan(1e-9);
  });

  it("keeps a high-order narrow lowpass stable and close in sections (Q15, Q31, f32)", () => {
    const d = butter(8, 20);
    for (const [format, worstDb] of [["q15", 0.2], ["q31", 1e-5], ["f32", 1e-3]] as const) {
      const q = quantizeDesign(d, format);
      expect(q.stable, format).toBe(true);
      expect(q.maxPoleRadius, format).toBeLessThan(1);
      expect(Math.abs(q.maxPoleRadius - q.maxPoleRadiusBefore), format).toBeLessThan(1e-3);
      expect(q.maxDeviationDb, format).toBeLessThan(worstDb);
      expect(q.shifts.length, format).toBe(4);
    }
    const f32 = quantizeDesign(d, "f32");
    expect(f32.integers).toBeUndefined();
    expect(f32.shifts).toEqual([0, 0, 0, 0]);
    expect(f32.sos?.flat().every((v) => Math.fround(v) === v)).toBe(true);
  });

  it("quantizes FIR taps as one group with no poles", () => {
    const taps = [0.1, 0.2, 0.4, 0.2, 0.1];
    const q = quantizeDesign({ sampleRateHz: 100, taps, zeros: [], poles: [], gain: 1 }, "q15");
    expect(q.integers).toEqual([[3277, 6554, 13107, 6554, 3277]]);
    expect(q.shifts).toEqual([0]);
    expect(q).toMatchObject({ stable: true, maxPoleRadius: 0, maxPoleRadiusBefore: 0 });
    expect(q.maxDeviationDb).toBeLessThan(0.01);
  });

  it("rejects unknown formats", () => {
    expect(() => quantizeDesign(butter(2, 100), "q7" as "q15")).toThrow(/'q15', 'q31' or 'f32'/);
  });
});

describe("sections vs direct form (Oppenheim & Schafer, Discrete-Time Signal Processing, 3rd ed., ch. 6 on coefficient quantization — from memory)", () => {
  it("a Butterworth order 8 at fc = 0.02·fs goes unstable in Q15 direct form while its sections stay stable", () => {
    const report = compareStructures(butter(8, 20), "q15");
    expect(report.sections.stable).toBe(true);
    expect(report.directForm.stable).toBe(false);
    expect(report.directForm.maxPoleRadius).toBeGreaterThan(1);
    expect(report.sections.maxDeviationDb).toBeLessThan(0.2);
  });

  it("direct form keeps the exact expanded polynomials' poles when quantization is fine enough", () => {
    const direct = quantizeDirectForm(butter(4, 100), "q31");
    expect(direct.stable).toBe(true);
    expect(direct.a[0]).toBe(1);
    expect(direct.b.length).toBe(5);
    expect(direct.maxDeviationDb).toBeLessThan(1e-3);
  });
});

describe("assertDeployable", () => {
  it("passes a stable quantized design", () => {
    expect(() => assertDeployable(quantizeDesign(butter(2, 100), "q15"))).not.toThrow();
  });

  it("reports a section whose poles round onto the unit circle, naming the radius", () => {
    // Poles at radius √0.99999 < 1; a2/2 = 0.499995 is 16383.8 LSB, which rounds to 16384: a2 = 1.
    const d: FilterDesign = { sampleRateHz: 1000, sos: [[0.01, 0, 0, 1, -1.9, 0.99999]], zeros: [], poles: [], gain: 1 };
    const q = quantizeDesign(d, "q15");
    expect(q.integers?.[0][4]).toBe(16384);
    expect(q.stable).toBe(false);
    expect(q.maxPoleRadiusBefore).toBeLessThan(1);
    expect(q.maxPoleRadius).toBeCloseTo(1, 12);
    expect(() => assertDeployable(q)).toThrow(/unstable: largest pole radius 1/);
  });
});
