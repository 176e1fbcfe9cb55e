import { describe, expect, it } from "vitest";
import { quantizeGroup } from "@/lib/dsp/fixed/coefficient-quantizer";
import { roundHalfAway, toWord, wordLimits, wordToReal } from "@/lib/dsp/fixed/q-format";

describe("Q15/Q31 words: rounding to nearest (ties away from zero) and saturation", () => {
  it("rounds ties away from zero, exactly even just below one half", () => {
    expect([2.5, -2.5, 1.5, -0.5, 0.4999999999999999, -0.4999999999999999, 3].map(roundHalfAway)).toEqual([3, -3, 2, -1, 0, -0, 3]);
  });

  it("has the Q15 range [−1, 1 − 2^−15] (common practice: 16-bit two's complement scaled by 2^−15, max 1 − 2^−15 = 0.999969482421875)", () => {
    expect(wordLimits("q15")).toEqual({ min: -32768, max: 32767 });
    expect(wordToReal(32767, "q15")).toBe(0.999969482421875);
    expect(wordLimits("q31")).toEqual({ min: -(2 ** 31), max: 2 ** 31 - 1 });
  });

  it("maps the edge values of Q15", () => {
    expect(toWord(-1, "q15")).toEqual({ word: -32768, saturated: false });
    expect(toWord(1 - 2 ** -15, "q15")).toEqual({ word: 32767, saturated: false });
    expect(toWord(1, "q15")).toEqual({ word: 32767, saturated: true });
    // 1 − 2^−16 is 32767.5 LSB: the tie rounds up past the max and saturates.
    expect(toWord(1 - 2 ** -16, "q15")).toEqual({ word: 32767, saturated: true });
    expect(toWord(1 - 2 ** -16 - 2 ** -40, "q15")).toEqual({ word: 32767, saturated: false });
    expect(toWord(-1 - 2 ** -16, "q15")).toEqual({ word: -32768, saturated: true });
    expect(toWord(-1 - 2 ** -17, "q15")).toEqual({ word: -32768, saturated: false });
    expect(toWord(2 ** -16, "q15").word).toBe(1);
    expect(toWord(-(2 ** -16), "q15").word).toBe(-1);
    expect(toWord(-5, "q15")).toEqual({ word: -32768, saturated: true });
  });

  it("maps the edge values of Q31", () => {
    expect(toWord(-1, "q31")).toEqual({ word: -(2 ** 31), saturated: false });
    expect(toWord(1 - 2 ** -31, "q31")).toEqual({ word: 2 ** 31 - 1, saturated: false });
    expect(toWord(1 - 2 ** -32, "q31")).toEqual({ word: 2 ** 31 - 1, saturated: true });
    expect(toWord(0.5 + 2 ** -33, "q31").word).toBe(2 ** 30);
  });

  it("rejects non-finite values and unknown formats", () => {
    expect(() => toWord(NaN, "q15")).toThrow(/finite/);
    expect(() => toWord(0.5, "q7" as "q15")).toThrow(/'q15' or 'q31'/);
  });
});

describe("coefficient groups and post-shift", () => {
  it("picks the smallest shift at which no word saturates", () => {
    expect(quantizeGroup([-1, 0.5], "q15").shift).toBe(0);
    expect(quantizeGroup([1, 0.5], "q15")).toEqual({ values: [1, 0.5], words: [16384, 8192], shift: 1 });
    expect(quantizeGroup([-1.9, 0.95], "q15").shift).toBe(1);
    expect(quantizeGroup([3.5], "q15").shift).toBe(2);
  });

  it("throws when the needed shift leaves no headroom bit", () => {
    expect(() => quantizeGroup([2 ** 14], "q15")).toThrow(/post-shift above 14/);
    expect(quantizeGroup([2 ** 14 - 1], "q15").shift).toBe(14);
  });

  it("rounds f32 coefficients with Math.fround and no shift", () => {
    expect(quantizeGroup([0.1, -1.7], "f32")).toEqual({ values: [Math.fround(0.1), Math.fround(-1.7)], shift: 0 });
  });
});
