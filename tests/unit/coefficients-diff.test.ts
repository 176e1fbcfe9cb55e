import { describe, expect, it } from "vitest";
import { diffSpecs, magnitudeSeries, plotFrequencies } from "@/lib/coefficients";
import { designFilter } from "@/lib/dsp";

describe("revision diff", () => {
  it("lists changed, added and removed spec fields by dotted path", () => {
    const a = { kind: "iir", family: "butterworth", response: "bandpass", order: 2, cutoffHz: [40, 60], sampleRateHz: 1000 };
    const b = { kind: "iir", family: "chebyshev1", response: "bandpass", order: 2, cutoffHz: [40, 65], passbandRippleDb: 1, sampleRateHz: 1000 };
    expect(diffSpecs(a, b)).toEqual([
      { field: "cutoffHz.1", before: 60, after: 65 },
      { field: "family", before: "butterworth", after: "chebyshev1" },
      { field: "passbandRippleDb", before: undefined, after: 1 },
    ]);
    expect(diffSpecs(a, a)).toEqual([]);
  });

  it("plots on a log grid from fs/10⁴ to fs/2 where a Butterworth low-pass is −3.0103 dB at fc (Butterworth 1930)", () => {
    const freqs = plotFrequencies(1000, 5);
    expect(freqs[0]).toBeCloseTo(0.1, 12);
    expect(freqs[4]).toBeCloseTo(500, 9);
    const design = designFilter({ kind: "iir", family: "butterworth", response: "lowpass", order: 4, cutoffHz: 100, sampleRateHz: 1000 });
    const [db] = magnitudeSeries([design], [100]);
    expect(db[0]).toBeCloseTo(-3.0103, 3);
  });
});
