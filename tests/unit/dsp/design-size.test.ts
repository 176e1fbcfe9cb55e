import { describe, expect, it } from "vitest";
import { filterSpecSchema } from "@/lib/dsp/filter-spec";
import { SPEC_LIMITS } from "@/lib/dsp/spec";
import { stageSize, totalSize } from "@/lib/dsp/design-size";
import type { StageSpec } from "@/lib/dsp/spec";

const fs = 1000;
const ramp = (n: number) => Array.from({ length: n }, (_, i) => (i === 0 ? 1 : 0.001 * i));
const ellipticBand: StageSpec = {
  kind: "iir",
  family: "elliptic",
  response: "bandpass",
  order: 6,
  cutoffHz: [100, 200],
  passbandRippleDb: 1,
  stopbandAttenuationDb: 60,
  sampleRateHz: fs,
};
const fir1023: StageSpec = { kind: "fir", response: "lowpass", window: "hamming", taps: 1023, cutoffHz: 100, sampleRateHz: fs };
const chain = (stages: object[]) => ({ kind: "chain", sampleRateHz: fs, stages });

function issues(spec: unknown): string[] {
  const parsed = filterSpecSchema.safeParse(spec);
  return parsed.success ? [] : parsed.error.issues.map((i) => `${i.path.join(".")}: ${i.message}`);
}

describe("design size, counted from the spec", () => {
  it("counts sections for recursive stages and taps for FIR stages", () => {
    expect(stageSize(ellipticBand)).toEqual({ order: 12, sections: 6, taps: 0 });
    expect(stageSize(fir1023)).toEqual({ order: 1022, sections: 0, taps: 1023 });
    expect(stageSize({ kind: "coefficients", b: ramp(1024), a: ramp(65), sampleRateHz: fs })).toEqual({ order: 1023, sections: 512, taps: 0 });
    expect(stageSize({ kind: "coefficients", b: ramp(9), a: [2, 0, 0], sampleRateHz: fs })).toEqual({ order: 8, sections: 0, taps: 9 });
    expect(stageSize({ kind: "coefficients", sos: [[1, 0, 0, 1, 0, 0]], sampleRateHz: fs })).toEqual({ order: 2, sections: 1, taps: 0 });
    expect(totalSize([ellipticBand, fir1023])).toEqual({ order: 1034, sections: 6, taps: 1023 });
  });
});

describe("design-size limits in the schema", () => {
  it("refuses the pasted 1,024-tap b with a 65-tap a before any work, saying what to change", () => {
    const found = issues({ kind: "coefficients", b: ramp(1024), a: ramp(65), sampleRateHz: fs });
    expect(found).toEqual([
      "b: this design has 512 second-order sections in total; at most 64 are allowed in one design: pasted b and a may have at most 65 coefficients each, or give b alone for an FIR",
    ]);
  });

  it("accepts the largest recursive paste (65 and 65: 32 sections) and the longest pasted FIR", () => {
    expect(issues({ kind: "coefficients", b: ramp(65), a: ramp(65), sampleRateHz: fs })).toEqual([]);
    expect(issues({ kind: "coefficients", b: ramp(SPEC_LIMITS.maxPastedTaps), sampleRateHz: fs })).toEqual([]);
  });

  it("caps a chain's total sections, taps and order over its running stages", () => {
    const pasted32 = { kind: "coefficients" as const, sos: Array.from({ length: 32 }, () => [1, 0, 0, 1, 0, 0]), sampleRateHz: fs };
    expect(issues(chain([pasted32, pasted32, pasted32]))).toEqual([
      "stages: the chain's 3 running stages have 96 second-order sections in total; at most 64 are allowed in one design: lower the stages' orders or remove stages",
    ]);
    expect(issues(chain(Array(8).fill(ellipticBand)))).toEqual([]);
    expect(issues(chain([fir1023, fir1023, fir1023]))).toEqual([
      "stages: the chain's 3 running stages have 3069 FIR taps in total; at most 2048 are allowed in one design: use fewer taps or fewer FIR stages",
    ]);
    expect(issues(chain([fir1023, fir1023, ellipticBand]))).toEqual([
      "stages: the chain's 3 running stages have order 2056 in total; at most 2048 is allowed in one design: use fewer taps or lower orders",
    ]);
    expect(issues(chain(Array(5).fill(ellipticBand)))).toEqual([]);
  });

  it("does not count bypassed stages, which are never designed", () => {
    expect(issues(chain([...Array(5).fill(ellipticBand), ...Array(3).fill({ ...ellipticBand, bypassed: true })]))).toEqual([]);
  });

  it("keeps the per-field limits within the totals, so one stage at its own limit always fits", () => {
    expect(SPEC_LIMITS.maxSosRows).toBeLessThanOrEqual(SPEC_LIMITS.maxTotalSections);
    expect(SPEC_LIMITS.maxMovingAverageLength).toBeLessThanOrEqual(SPEC_LIMITS.maxTotalTaps);
    expect(Math.ceil((SPEC_LIMITS.maxPastedDenominator - 1) / 2)).toBeLessThanOrEqual(SPEC_LIMITS.maxTotalSections);
    expect(Math.ceil(SPEC_LIMITS.maxCombOrder / 2)).toBeLessThanOrEqual(SPEC_LIMITS.maxTotalSections);
    expect(issues({ kind: "moving-average", length: SPEC_LIMITS.maxMovingAverageLength, sampleRateHz: fs })).toEqual([]);
  });
});
