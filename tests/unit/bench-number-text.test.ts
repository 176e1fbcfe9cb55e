import { describe, expect, it } from "vitest";
import { numberTextError, readNumberText } from "@/lib/bench/number-text";

describe("typed numbers in the stage forms", () => {
  it("refuse a decimal comma with a clear message and never read it as another number", () => {
    expect(numberTextError("12,5")).toBe("Write decimals with a point: 12.5, not 12,5.");
    expect(readNumberText("12,5", false)).toBeNaN();
    expect(readNumberText("12,5", true)).toBeNaN();
    expect(numberTextError(",5")).toBe("Write decimals with a point: .5, not ,5.");
  });

  it("read plain decimals, signs and exponents as written", () => {
    for (const [text, value] of [
      ["12.5", 12.5],
      [" 120 ", 120],
      ["-3", -3],
      [".5", 0.5],
      ["1e3", 1000],
      ["2.5E-1", 0.25],
    ] as const) {
      expect(numberTextError(text), text).toBeNull();
      expect(readNumberText(text, false), text).toBe(value);
    }
  });

  it("refuse other text, hex and thousands separators instead of guessing", () => {
    for (const text of ["abc", "0x10", "1,000,000", "1 000", "12.5.1"]) {
      expect(numberTextError(text), text).toMatch(/is not a number|Write decimals with a point/);
      expect(readNumberText(text, false), text).toBeNaN();
    }
  });

  it("read an empty field as absent when optional and as NaN (refused by the schema) otherwise", () => {
    expect(numberTextError("  ")).toBeNull();
    expect(readNumberText("", true)).toBeUndefined();
    expect(readNumberText("", false)).toBeNaN();
  });
});
