import { describe, expect, it } from "vitest";
import fixture from "../../fixtures/dsp/analysis-welch.json";
import { findPeaks, periodicHann, welch, welchAt } from "@/lib/dsp/analysis";

interface WelchCase {
  name: string;
  signal: keyof typeof fixture.signals;
  segmentLength: number;
  overlap: number | null;
  freqsHz: number[];
  psd: number[];
}

/** Seeded Gaussian noise for statistical checks: mulberry32 (common practice) + Box–Muller. */
function gaussianNoise(n: number, seed: number): Float64Array {
  let s = seed >>> 0;
  const uniform = () => {
    s = (s + 0x6d2b79f5) >>> 0;
    let t = s;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
  const out = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const u = 1 - uniform();
    out[i] = Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * uniform());
  }
  return out;
}

// Tolerance and its reason are recorded in the fixture by tests/fixtures/gen/analysis.py (scipy 1.10.1).
describe(`welch against scipy.signal.welch ${fixture.scipyVersion}`, () => {
  it.each((fixture.cases as WelchCase[]).map((c) => [c.name, c] as const))("%s", (_name, c) => {
    const sig = fixture.signals[c.signal];
    const r = welch(Float64Array.from(sig.x), sig.sampleRateHz, {
      segmentLength: c.segmentLength,
      ...(c.overlap === null ? {} : { overlap: c.overlap }),
    });
    expect(r.freqsHz).toHaveLength(c.freqsHz.length);
    r.freqsHz.forEach((f, i) => expect(f).toBeCloseTo(c.freqsHz[i], 9));
    const bound = fixture.tolerance.relativeToMaxPsd * Math.max(...c.psd);
    r.psd.forEach((p, i) => expect(Math.abs(p - c.psd[i])).toBeLessThanOrEqual(bound));
  });

  it.each((fixture.cases as WelchCase[]).map((c) => [c.name, c] as const))("welchAt gives scipy's PSD in each bin it is asked for: %s", (_name, c) => {
    const sig = fixture.signals[c.signal];
    const x = Float64Array.from(sig.x);
    const opts = { segmentLength: c.segmentLength, ...(c.overlap === null ? {} : { overlap: c.overlap }) };
    const bound = fixture.tolerance.relativeToMaxPsd * Math.max(...c.psd);
    c.freqsHz.forEach((f, k) => expect(Math.abs(welchAt(x, sig.sampleRateHz, f, opts) - c.psd[k])).toBeLessThanOrEqual(bound));
    // Between bins it answers the nearest one, as the live metrics' raw side (psd[round(f/Δf)]) does.
    const df = c.freqsHz[1] - c.freqsHz[0];
    expect(welchAt(x, sig.sampleRateHz, 2.4 * df, opts)).toBe(welchAt(x, sig.sampleRateHz, 2 * df, opts));
  });

  it("defaults to nperseg = 256 and noverlap = 128 like scipy", () => {
    const sig = fixture.signals["fs1000"];
    const ref = (fixture.cases as WelchCase[]).find((c) => c.name === "fs1000/nperseg256/noverlapNone");
    if (!ref) throw new Error("default case missing");
    const r = welch(Float64Array.from(sig.x), sig.sampleRateHz);
    const bound = fixture.tolerance.relativeToMaxPsd * Math.max(...ref.psd);
    r.psd.forEach((p, i) => expect(Math.abs(p - ref.psd[i])).toBeLessThanOrEqual(bound));
  });
});

describe("welch: checks from the definitions (one-sided PSD 2σ²/fs of white noise; Hann ENBW 1.5 bins, Harris 1978)", () => {
  it("white noise σ = 1 at fs = 1 kHz has mean one-sided PSD 2σ²/fs = 0.002 unit²/Hz", () => {
    const x = gaussianNoise(1 << 16, 20261202);
    const { psd } = welch(x, 1000);
    const inner = psd.slice(1, -1);
    const mean = inner.reduce((s, p) => s + p, 0) / inner.length;
    // Statistical tolerance: the sample variance of 65536 Gaussian samples has relative standard
    // deviation √(2/65536) = 0.55 %; 3 % is more than 5 of those.
    expect(Math.abs(mean - 0.002) / 0.002).toBeLessThan(0.03);
  });

  it("a sine of amplitude A = 3 on a bin centre peaks at A²/2/(ENBW·Δf) = 3.0 unit²/Hz with Hann (ENBW 1.5 bins, Δf = 1 Hz)", () => {
    const fs = 1000;
    const x = Float64Array.from({ length: 4000 }, (_, k) => 3 * Math.sin((2 * Math.PI * 50 * k) / fs));
    const { freqsHz, psd } = welch(x, fs, { segmentLength: 1000 });
    const k = freqsHz.indexOf(50);
    expect(psd[k]).toBeCloseTo(3.0, 9);
    const w = periodicHann(1000);
    const enbw = (1000 * w.reduce((s, v) => s + v * v, 0)) / w.reduce((s, v) => s + v, 0) ** 2;
    expect(enbw).toBeCloseTo(1.5, 12);
  });

  it("rejects bad options with the allowed range", () => {
    const x = new Float64Array(100);
    expect(() => welch(x, 1000, { segmentLength: 101 })).toThrow(/\[2, 100\]/);
    expect(() => welch(x, 1000, { segmentLength: 64, overlap: 64 })).toThrow(/\[0, 63\]/);
    expect(() => welch(x, -1)).toThrow(/> 0 Hz/);
    expect(() => welch(Float64Array.of(1, NaN, 2), 1000)).toThrow(/finite/);
  });

  it("handles a short signal with a non-power-of-two default segment (the whole signal, like scipy)", () => {
    const x = Float64Array.from({ length: 100 }, (_, k) => Math.sin(k / 3));
    const r = welch(x, 100);
    expect(r.freqsHz).toHaveLength(51);
    expect(r.psd.every(Number.isFinite)).toBe(true);
  });
});

describe("findPeaks", () => {
  it("finds the tones of the fixture signal strongest first, excluding DC, near their true frequencies", () => {
    const sig = fixture.signals["fs1000"];
    const { freqsHz, psd } = welch(Float64Array.from(sig.x), sig.sampleRateHz, { segmentLength: 1000 });
    const peaks = findPeaks(freqsHz, psd, { count: 2, minProminenceDb: 10 });
    expect(peaks.map((p) => p.freqHz)).toHaveLength(2);
    expect(Math.abs(peaks[0].freqHz - 50)).toBeLessThan(0.05);
    expect(Math.abs(peaks[1].freqHz - 123.4)).toBeLessThan(0.1);
    expect(peaks[0].psd).toBeGreaterThan(peaks[1].psd);
    expect(peaks.every((p) => p.prominenceDb >= 10)).toBe(true);
  });

  it("parabolic interpolation recovers the vertex of a sampled parabola in dB exactly", () => {
    const f = Array.from({ length: 11 }, (_, i) => i * 2);
    const vertexHz = 9.3;
    const db = f.map((v) => 20 - 0.5 * (v - vertexHz) ** 2);
    const [peak] = findPeaks(f, db.map((d) => 10 ** (d / 10)), { count: 1, minProminenceDb: 0 });
    expect(peak.freqHz).toBeCloseTo(vertexHz, 9);
    expect(10 * Math.log10(peak.psd)).toBeCloseTo(20, 9);
  });

  it("keeps peaks at least minSpacingHz apart, the stronger one winning", () => {
    const f = [0, 1, 2, 3, 4, 5, 6, 7, 8];
    const p = [100, 1, 10, 1, 8, 1, 1, 5, 1];
    expect(findPeaks(f, p, { minProminenceDb: 0 }).map((k) => k.freqHz.toFixed(0))).toEqual(["2", "4", "7"]);
    expect(findPeaks(f, p, { minProminenceDb: 0, minSpacingHz: 3 }).map((k) => k.freqHz.toFixed(0))).toEqual(["2", "7"]);
  });
});
