import { describe, expect, it } from "vitest";
import { arithmeticLabel, designIir, quantizeDesign, simulateFixed, type QuantizedDesign } from "@/lib/dsp";

/**
 * The library arithmetic modes of simulateFixed on cases worked by hand from the documented kernel
 * arithmetic (CMSIS-DSP documentation, "Scaling and Overflow Behavior" of each kernel — from memory).
 * The compiled cross-check against a C harness is tests/unit/export-cmsis-gcc.test.ts.
 */

/** A single-design quantized form from words: sections rows [b0, b1, b2, a1, a2] with shifts, or FIR taps. */
function words(format: "q15" | "q31", rows: number[][], shifts: number[], fir = false): QuantizedDesign {
  const scale = 2 ** (format === "q15" ? 15 : 31);
  const real = (w: number, s: number) => (w * 2 ** s) / scale;
  return {
    format,
    sampleRateHz: 1000,
    ...(fir
      ? { taps: rows[0].map((w) => real(w, shifts[0])) }
      : { sos: rows.map(([b0, b1, b2, a1, a2], i) => [b0, b1, b2, scale, a1, a2].map((w) => real(w, shifts[i]))) }),
    integers: rows,
    shifts,
    stable: true,
    maxPoleRadiusBefore: 0,
    maxPoleRadius: 0,
    maxDeviationDb: 0,
  };
}

const outWords = (y: Float64Array, bits: number) => Array.from(y, (v) => v * 2 ** bits);
const inWords = (w: number[], bits: number) => Float64Array.from(w, (v) => v / 2 ** bits);

describe("simulateFixed with the library's arithmetic", () => {
  it("Q15 biquad truncates where ours rounds: b0 = 0.5 on ±1 LSB", () => {
    const q = words("q15", [[16384, 0, 0, 0, 0]], [0]);
    const x = inWords([1, -1, 3], 15);
    // 16384·1 = 2^14: ours adds 2^14 and shifts by 15 → 1; truncated → 0. −2^14 → floor(−0.5) = −1 vs 0.
    expect(outWords(simulateFixed(q, x).y, 15)).toEqual([1, 0, 2]);
    expect(outWords(simulateFixed(q, x, "cmsis").y, 15)).toEqual([0, -1, 1]);
  });

  it("the feedback is added with the library's sign, which runs the same filter as ours", () => {
    // y = x + 0.5·y1 in our convention is a1 = −0.5 (word −16384), stored +16384 by the library.
    const q = words("q15", [[32767, 0, 0, -16384, 0]], [0]);
    const x = inWords([16384, 0, 0, 0], 15);
    expect(outWords(simulateFixed(q, x, "cmsis").y, 15)).toEqual([16383, 8191, 4095, 2047]);
  });

  it("the post-shift moves the accumulator by 15 − postShift", () => {
    const q = words("q15", [[24576, 0, 0, 0, 0]], [1]); // b0 = 1.5 as 0.75 · 2^1
    expect(outWords(simulateFixed(q, inWords([1000, -1000], 15), "cmsis").y, 15)).toEqual([1500, -1500]);
  });

  it("fast Q15 wraps its 32-bit accumulator where the standard kernel saturates", () => {
    const q = words("q15", [[32767, 32767, 32767, 0, 0]], [0]);
    const x = inWords([-32768, -32768, -32768], 15);
    // Third sample: 3·32767·(−32768) = −3221127168 < −2^31: the 64-bit sum saturates to −32768,
    // the 32-bit one wraps to 1073840128 → 32770 after >> 15 → saturated at 32767.
    const standard = simulateFixed(q, x, "cmsis");
    const fast = simulateFixed(q, x, "cmsis-fast");
    expect(outWords(standard.y, 15)).toEqual([-32767, -32768, -32768]);
    expect(outWords(fast.y, 15)[2]).toBe(32767);
    expect(fast.overflows).toBe(standard.overflows + 1);
  });

  it("Q31 biquad output wraps (no saturation) while the Q31 FIR saturates, both counted", () => {
    const max = 2 ** 31 - 1;
    const section = words("q31", [[max, max, 0, 0, 0]], [0]);
    const fir = words("q31", [[max, max]], [0], true);
    const x = inWords([max, max], 31);
    // (2^31 − 1)² · 2 >> 31 = 2^32 − 4 + … → 4294967292 wraps to −4 as a word; the FIR clips at 2^31 − 1.
    expect(outWords(simulateFixed(section, x, "cmsis").y, 31)).toEqual([max - 1, -4]);
    expect(outWords(simulateFixed(fir, x, "cmsis").y, 31)).toEqual([max - 1, max]);
    expect(simulateFixed(section, x, "cmsis").overflows).toBe(1);
    expect(simulateFixed(fir, x, "cmsis").overflows).toBe(1);
  });

  it("fast Q31 keeps the high word of each product (floor), then shifts left by postShift + 1", () => {
    const q = words("q31", [[1, 0, 0, 0, 0]], [0]);
    // 1·(−1) = −1 → floor(−1 / 2^32) = −1 → ·2 = −2; the standard kernel: −1 >> 31 = −1.
    expect(outWords(simulateFixed(q, inWords([-1, 1], 31), "cmsis-fast").y, 31)).toEqual([-2, 0]);
    expect(outWords(simulateFixed(q, inWords([-1, 1], 31), "cmsis").y, 31)).toEqual([-1, 0]);
  });

  it("refuses what the library cannot hold: an FIR with a post-shift, a feedback word −2^F", () => {
    expect(() => simulateFixed(words("q15", [[20000, 20000]], [1], true), new Float64Array(2), "cmsis")).toThrow(/no post-shift/);
    expect(() => simulateFixed(words("q15", [[1000, 0, 0, -32768, 0]], [1]), new Float64Array(2), "cmsis")).toThrow(/no negation/);
  });

  it("a designed filter runs in every arithmetic within a few LSB of ours", () => {
    const design = designIir({ kind: "iir", family: "butterworth", response: "lowpass", order: 4, cutoffHz: 100, sampleRateHz: 1000 });
    const x = Float64Array.from({ length: 2000 }, (_, n) => 0.2 * Math.sin(n / 7) + 0.1 * Math.sign(Math.sin(n / 50)));
    for (const format of ["q15", "q31"] as const) {
      const q = quantizeDesign(design, format);
      const ours = simulateFixed(q, x);
      for (const arithmetic of ["cmsis", "cmsis-fast"] as const) {
        const run = simulateFixed(q, x, arithmetic);
        const worst = run.y.reduce((m, v, i) => Math.max(m, Math.abs(v - ours.y[i])), 0);
        // Common practice: truncation noise through a 4th-order low-pass with poles well inside the unit
        // circle stays within some LSB of the rounded run (measured here: 7 LSB for Q15, 6 and 102 LSB for
        // Q31 and fast Q31, which drops the low word of every product).
        expect(run.overflows).toBe(0);
        expect(worst).toBeLessThan(format === "q15" ? 16 * 2 ** -15 : 2 ** -22);
      }
    }
  });

  it("labels say whose arithmetic is shown", () => {
    expect(arithmeticLabel("tapwright", "q15")).toMatch(/^Tapwright Q15: .*rounded/);
    expect(arithmeticLabel("cmsis", "q15")).toBe("CMSIS-DSP arm_biquad_cascade_df1_q15 / arm_fir_q15: 64-bit accumulator, truncated, saturated");
    expect(arithmeticLabel("cmsis-fast", "q31")).toMatch(/arm_biquad_cascade_df1_fast_q31 \/ arm_fir_fast_q31/);
  });
});
