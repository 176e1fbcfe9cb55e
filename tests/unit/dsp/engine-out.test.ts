import { describe, expect, it } from "vitest";
import { designFilter, filterSignal } from "@/lib/dsp";

describe("filterSignal with a caller's output buffer", () => {
  const design = designFilter({ kind: "iir", family: "butterworth", response: "lowpass", order: 4, cutoffHz: 50, sampleRateHz: 1000 });
  const x = Float64Array.from({ length: 500 }, (_, i) => Math.sin(i / 7) + (i % 13) / 13);

  it("writes the same values into `out` as it returns without it, and returns `out`", () => {
    const out = new Float64Array(x.length);
    expect(filterSignal(design, x, { out })).toBe(out);
    expect(Array.from(out)).toEqual(Array.from(filterSignal(design, x)));
    expect(Array.from(filterSignal(design, x, { out, initial: "step" }))).toEqual(Array.from(filterSignal(design, x, { initial: "step" })));
  });

  it("refuses an output of the wrong length", () => {
    expect(() => filterSignal(design, x, { out: new Float64Array(3) })).toThrow(/out must have 500 entries/);
  });
});
