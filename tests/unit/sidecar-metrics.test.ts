import { describe, expect, it } from "vitest";
import { designFilter, filterSignal, peakGainDb } from "@/lib/dsp";
import { candidateMetrics, crossCorrelationLag, rawSpectrum } from "@/server/pipeline/metrics";
import { mulberry32 } from "@/server/demo-rig/prng";
import { bucketSize, minMaxDecimate } from "@/server/pipeline/decimate";

/** The definition the FFT form must reproduce: Σ (x[n−k] − x̄)(y[n] − ȳ) / (N − k), argmax over k. */
function directLag(x: Float64Array, y: Float64Array, maxLag: number): number {
  const n = x.length;
  const mx = x.reduce((a, b) => a + b, 0) / n;
  const my = y.reduce((a, b) => a + b, 0) / n;
  let best = 0;
  let bestValue = -Infinity;
  for (let k = 0; k <= maxLag; k++) {
    let s = 0;
    for (let i = k; i < n; i++) s += (x[i - k] - mx) * (y[i] - my);
    if (s / (n - k) > bestValue) [bestValue, best] = [s / (n - k), k];
  }
  return best;
}

describe("live metrics", () => {
  it("the FFT cross-correlation finds the same lag as the direct sum, and a known delay", () => {
    const rnd = mulberry32(5);
    for (let t = 0; t < 40; t++) {
      const n = 200 + Math.floor(rnd() * 1800);
      const delay = Math.floor(rnd() * 120);
      const x = Float64Array.from({ length: n }, () => rnd() - 0.5);
      const y = Float64Array.from({ length: n }, (_, i) => (i >= delay ? x[i - delay] : 0) + 0.2 * (rnd() - 0.5));
      const lag = crossCorrelationLag(x, y, 150);
      expect(lag).toBe(directLag(x, y, 150));
      expect(lag).toBe(delay);
    }
  });

  it("a 50 Hz notch on hum plus noise: line found, attenuation measured near the prediction", () => {
    const fs = 1000;
    const rnd = mulberry32(9);
    const hum = 10;
    const raw = Float64Array.from({ length: 3000 }, (_, i) => hum * Math.sin((2 * Math.PI * 50 * i) / fs) + 0.5 * (rnd() - 0.5));
    const design = designFilter({ kind: "biquad", shape: "notch", centerHz: 50, q: 2, sampleRateHz: fs });
    const out = filterSignal(design, raw);
    const last = (v: Float64Array) => v.subarray(v.length - fs);
    const m = candidateMetrics(last(raw), last(out), { design, passbandDb: peakGainDb(design) }, rawSpectrum(last(raw), fs));
    expect(m.noiseLineHz).toBeCloseTo(50, 0);
    expect(m.removedRms!).toBeGreaterThan(0.9 * (hum / Math.SQRT2));
    expect(m.removedRms!).toBeLessThan(1.1 * (hum / Math.SQRT2));
    expect(m.measuredAttenuationDb!).toBeGreaterThan(20);
    expect(m.predictedAttenuationDb!).toBeGreaterThan(40);
  });
});

describe("min/max decimation", () => {
  it("keeps both extremes of every bucket in time order", () => {
    expect(minMaxDecimate([3, 9, 1, 4, 4, 7, -2], 3)).toEqual([9, 1, 4, 7, -2, -2]);
    expect(bucketSize(1000, 2000)).toBe(1);
    expect(bucketSize(10_000, 100)).toBe(200);
    expect(() => minMaxDecimate([1], 0)).toThrow(/bucket/);
  });
});
