import { describe, expect, it } from "vitest";
import fixture from "../../fixtures/dsp/engine-fixed.json";
import { filterSignal } from "@/lib/dsp/engine/filter-signal";
import { quantizeDesign, type QuantizedDesign } from "@/lib/dsp/fixed/quantize-design";
import { simulateFixed } from "@/lib/dsp/fixed/simulate-fixed";
import { designIir } from "@/lib/dsp/iir/design";
import type { FilterDesign } from "@/lib/dsp/types";

const LSB_Q15 = 2 ** -15;

function fixtureDesign(c: (typeof fixture.cases)[number]): QuantizedDesign {
  const scale = 2 ** (c.format === "q15" ? 15 : 31);
  return {
    format: c.format as "q15" | "q31",
    sampleRateHz: 1000,
    sos: c.integers.map(([b0, b1, b2, a1, a2], i) => [b0, b1, b2, scale, a1, a2].map((w) => (w * 2 ** c.shifts[i]) / scale)),
    integers: c.integers,
    shifts: c.shifts,
    stable: true,
    maxPoleRadiusBefore: 0,
    maxPoleRadius: 0,
    maxDeviationDb: 0,
  };
}

/** Σ|h[n]| over the first n samples of a design's impulse response (filterSignal, float64). */
function l1Norm(design: FilterDesign, n = 4000): number {
  const impulse = new Float64Array(n);
  impulse[0] = 1;
  return filterSignal(design, impulse).reduce((s, v) => s + Math.abs(v), 0);
}

describe("simulateFixed: bit-true against an independent Python integer model", () => {
  // Fixture: tests/fixtures/gen/engine.py write_fixed (exact Python integers); tolerance 0.
  it.each(fixture.cases.map((c) => [c.name, c] as const))("%s", (_name, c) => {
    const { y, overflows } = simulateFixed(fixtureDesign(c), Float64Array.from(c.x));
    const scale = 2 ** (c.format === "q15" ? 15 : 31);
    expect(Array.from(y, (v) => v * scale)).toEqual(c.yWords);
    expect(overflows).toBe(c.overflows);
  });
});

describe("simulateFixed against float64", () => {
  it("a Q15 Butterworth order 4 step response stays within the rounding-noise bound of float64", () => {
    const design = designIir({ kind: "iir", family: "butterworth", response: "lowpass", order: 4, cutoffHz: 50, sampleRateHz: 1000 });
    const q = quantizeDesign(design, "q15");
    const sos = q.sos ?? [];
    const x = new Float64Array(3000).fill(0.5);
    const fixed = simulateFixed(q, x);
    const reference = filterSignal({ ...design, sos }, x);
    // Rounding errors, each at most 2^−16 in magnitude: the input's (through every section) and each
    // section output's (through that section's own recursion 1/A_k, then the later sections) —
    // a bound by the L1 norms of those paths (Oppenheim & Schafer, Discrete-Time Signal Processing, 3rd ed., ch. 6, from memory).
    const base = { sampleRateHz: 1000, zeros: [], poles: [], gain: 1 };
    const paths = sos.map((row, k) => ({ ...base, sos: [[1, 0, 0, 1, row[4], row[5]], ...sos.slice(k + 1)] }));
    const bound = 2 ** -16 * (l1Norm({ ...base, sos }) + paths.reduce((s, p) => s + l1Norm(p), 0));
    const worst = reference.reduce((m, v, i) => Math.max(m, Math.abs(v - fixed.y[i])), 0);
    expect(fixed.overflows).toBe(0);
    expect(worst).toBeLessThanOrEqual(bound);
    expect(worst).toBeGreaterThan(0);
    expect(bound).toBeLessThan(20 * LSB_Q15);
    // And against the unquantized design: the settled value is within a few LSB of 0.5 (DC gain 1).
    expect(Math.abs(fixed.y[2999] - 0.5)).toBeLessThan(8 * LSB_Q15);
  });

  it("counts saturated inputs (outside [−1, 1 − 2^−15] after rounding) and section outputs", () => {
    const q = quantizeDesign({ sampleRateHz: 1000, sos: [[1.5, 0, 0, 1, 0, 0]], zeros: [], poles: [], gain: 1 }, "q15");
    const { y, overflows } = simulateFixed(q, Float64Array.of(0.5, 1, -1.5, 0.9, -1));
    expect(Array.from(y)).toEqual([0.75, 1 - LSB_Q15, -1, 1 - LSB_Q15, -1]);
    // Inputs 1 and −1.5 saturate; outputs 1.5·(1 − 2^−15), −1.5, 1.35 and −1.5 saturate.
    expect(overflows).toBe(2 + 4);
  });

  it("rejects f32 designs, non-finite input and malformed words", () => {
    const design = designIir({ kind: "iir", family: "butterworth", response: "lowpass", order: 2, cutoffHz: 100, sampleRateHz: 1000 });
    expect(() => simulateFixed(quantizeDesign(design, "f32"), new Float64Array(2))).toThrow(/f32/);
    const q = quantizeDesign(design, "q15");
    expect(() => simulateFixed(q, Float64Array.of(0, NaN))).toThrow(/finite/);
    expect(() => simulateFixed({ ...q, shifts: [15] }, new Float64Array(2))).toThrow(/0…14/);
    expect(() => simulateFixed({ ...q, integers: [[1, 2, 3, 4, 40000]] }, new Float64Array(2))).toThrow(/-32768…32767/);
  });
});

describe("limit cycles (observation, Oppenheim & Schafer, Discrete-Time Signal Processing, 3rd ed., ch. 6 — from memory)", () => {
  it("a lightly damped Q15 section keeps oscillating on zero input while float64 decays", () => {
    // Poles at radius √0.99 ≈ 0.995: float64 decays to ~1e-44 after 20000 samples. Rounding inside the
    // DF1 recursion sustains a zero-input oscillation instead: observed here at 34 LSB with period 14.
    const design: FilterDesign = { sampleRateHz: 1000, sos: [[0.1, 0, 0, 1, -1.8, 0.99]], zeros: [], poles: [], gain: 1 };
    const x = new Float64Array(20000);
    x[0] = 0.5;
    const tail = Array.from(simulateFixed(quantizeDesign(design, "q15"), x).y.subarray(19000), (v) => v / LSB_Q15);
    expect(Math.max(...tail.map(Math.abs))).toBeGreaterThanOrEqual(10);
    expect(tail.slice(14)).toEqual(tail.slice(0, -14));
    expect(Math.abs(filterSignal(design, x)[19999])).toBeLessThan(1e-30);
  });
});
