import { describe, expect, it } from "vitest";
import { liveSpectrum, refinePeakHz } from "@/lib/bench/spectrum";

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

describe("refinePeakHz", () => {
  // A deterministic noise (LCG, Numerical Recipes constants) so the test is repeatable.
  const noise = (n: number, amplitude: number) => {
    let seed = 12345;
    return Float64Array.from({ length: n }, () => ((seed = (seed * 1664525 + 1013904223) >>> 0) / 2 ** 32 - 0.5) * 2 * amplitude);
  };
  const fs = 1000;

  it("finds mains hum and its harmonic well inside a Welch bin, over noise and a slow drift", () => {
    // 4 s at 1 kHz as the bench's live spectrum takes it: 50 Hz and 150 Hz lines of known frequency,
    // white noise and a large slow drift; the Welch bins are fs/512 ≈ 1.95 Hz wide.
    const n = 4000;
    const w = noise(n, 10);
    const x = Float64Array.from({ length: n }, (_, i) => {
      const t = i / fs;
      return 300 + 120 * Math.sin((2 * Math.PI * t) / 300) + 35 * Math.sin(2 * Math.PI * 50 * t) + 9 * Math.sin(2 * Math.PI * 150 * t + 2) + w[i];
    });
    expect(Math.abs(refinePeakHz(x, fs, 50.9, 1.95) - 50)).toBeLessThan(0.01);
    expect(Math.abs(refinePeakHz(x, fs, 149.2, 1.95) - 150)).toBeLessThan(0.02);
    const s = liveSpectrum(x, fs);
    const near = (f: number) => s?.peaks.find((p) => Math.abs(p.freqHz - f) < 1)?.freqHz ?? NaN;
    expect(Math.abs(near(50) - 50)).toBeLessThan(0.01);
    expect(Math.abs(near(150) - 150)).toBeLessThan(0.02);
  });

  it("leaves the estimate alone when the record cannot be used", () => {
    const x = Float64Array.from({ length: 1000 }, (_, i) => Math.sin((2 * Math.PI * 50 * i) / fs));
    x[10] = NaN;
    expect(refinePeakHz(x, fs, 50.3, 2)).toBe(50.3);
    expect(refinePeakHz(x.subarray(20, 60), fs, 50.3, 2)).toBe(50.3);
  });
});
