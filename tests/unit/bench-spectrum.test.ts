import { describe, expect, it } from "vitest";
import { liveSpectrum } from "@/lib/bench/spectrum";

describe("liveSpectrum", () => {
  const fs = 1000;
  const x = Float64Array.from({ length: 4096 }, (_, i) => Math.sin((2 * Math.PI * 50 * i) / fs) + 0.3 * Math.sin((2 * Math.PI * 240 * i) / fs));

  it("labels the strongest lines", () => {
    const s = liveSpectrum(x, fs);
    expect(s?.peaks.map((p) => Math.round(p.freqHz))).toEqual(expect.arrayContaining([50, 240]));
  });

  it("gives a spectrum without peaks when none are asked for", () => {
    const s = liveSpectrum(x, fs, 0);
    expect(s?.peaks).toEqual([]);
    expect(s?.psdDb.length).toBe(s?.freqsHz.length);
  });

  it("waits for enough samples", () => {
    expect(liveSpectrum(x.subarray(0, 10), fs)).toBeNull();
  });
});
