import { describe, expect, it } from "vitest";
import fixture from "../../fixtures/dsp/analysis-response.json";
import {
  analogResponse,
  attenuationDb,
  cutoffPoints,
  dcGain,
  freqGrid,
  frequencyResponse,
  MAGNITUDE_FLOOR_DB,
  peakGainDb,
  sectionInStabilityTriangle,
  stability,
  toMs,
} from "@/lib/dsp/analysis";
import { analogPrototypeZpk, designIir } from "@/lib/dsp/iir/design";
import type { IirSpec } from "@/lib/dsp/iir/spec";
import type { Complex, FilterDesign } from "@/lib/dsp/types";

interface ResponseCase {
  name: string;
  sampleRateHz: number;
  sos?: number[][];
  taps?: number[];
  freqsHz: number[];
  magnitudeDb: number[];
  phaseRad: number[];
  groupDelaySamples: number[];
  groupDelayExtended: number[];
  dcGain: number;
  maxPoleRadius: number;
}

const tol = fixture.tolerance;
const cases = fixture.cases as ResponseCase[];

function design(c: { sampleRateHz: number; sos?: number[][]; taps?: number[] }): FilterDesign {
  const base = { sampleRateHz: c.sampleRateHz, zeros: [], poles: [], gain: 1 };
  return c.sos ? { ...base, sos: c.sos } : { ...base, taps: c.taps };
}

function byName(name: string): ResponseCase {
  const c = cases.find((k) => k.name === name);
  if (!c) throw new Error(`fixture case ${name} missing`);
  return c;
}

// Tolerances and their reasons are recorded in the fixture by tests/fixtures/gen/analysis.py (scipy 1.10.1).
describe(`frequencyResponse against scipy.signal ${fixture.scipyVersion} sosfreqz/freqz/group_delay`, () => {
  it.each(cases.map((c) => [c.name, c] as const))("%s", (_name, c) => {
    const r = frequencyResponse(design(c), c.freqsHz);
    c.freqsHz.forEach((_, i) => {
      if (c.magnitudeDb[i] > tol.magnitudeFloorDb) {
        expect(Math.abs(r.magnitudeDb[i] - c.magnitudeDb[i])).toBeLessThanOrEqual(tol.magnitudeDb);
      }
      expect(Math.abs(r.phaseRad[i] - c.phaseRad[i])).toBeLessThanOrEqual(tol.phaseRad);
      const gd = r.groupDelaySamples[i];
      const extended = c.groupDelayExtended[i];
      expect(Math.abs(gd - extended)).toBeLessThanOrEqual(tol.groupDelayExtended * Math.max(1, Math.abs(extended)));
      const scipy = c.groupDelaySamples[i];
      expect(Math.abs(gd - scipy)).toBeLessThanOrEqual(tol.groupDelayScipy * Math.max(1, Math.abs(scipy)));
    });
  });

  it.each(cases.map((c) => [c.name, c] as const))("%s: dcGain and stability", (_name, c) => {
    expect(dcGain(design(c))).toBeCloseTo(c.dcGain, 12);
    const s = stability(design(c));
    expect(s.maxPoleRadius).toBeCloseTo(c.maxPoleRadius, 12);
    expect(s.stable).toBe(true);
  });
});

describe(`analogResponse against scipy.signal ${fixture.scipyVersion} freqs_zpk/freqs`, () => {
  it.each(fixture.analog.map((c) => [c.name, c] as const))("%s", (_name, c) => {
    const zpk = analogResponse({ zeros: c.zeros as Complex[], poles: c.poles as Complex[], gain: c.gain }, c.freqsHz);
    const tf = analogResponse({ num: c.num, den: c.den }, c.freqsHz);
    c.freqsHz.forEach((_, i) => {
      expect(Math.abs(zpk.magnitudeDb[i] - c.magnitudeDb[i])).toBeLessThanOrEqual(tol.magnitudeDb);
      expect(Math.abs(zpk.phaseRad[i] - c.phaseRad[i])).toBeLessThanOrEqual(tol.phaseRad);
      expect(Math.abs(tf.magnitudeDb[i] - c.tfMagnitudeDb[i])).toBeLessThanOrEqual(tol.magnitudeDb);
      expect(Math.abs(tf.phaseRad[i] - c.tfPhaseRad[i])).toBeLessThanOrEqual(tol.phaseRad);
    });
  });

  it("analog Butterworth N=4 is −3.0103 dB with phase −N·45° at ωc = 1 rad/s (Butterworth 1930; the poles sit symmetrically about ωc, common practice)", () => {
    const c = fixture.analog.find((k) => k.name === "buttap4");
    if (!c) throw new Error("buttap4 missing");
    const fc = 1 / (2 * Math.PI);
    const r = analogResponse({ zeros: [], poles: c.poles as Complex[], gain: c.gain }, [fc / 100, fc / 2, fc]);
    expect(r.magnitudeDb[2]).toBeCloseTo(-10 * Math.log10(2), 10);
    expect(r.phaseRad[2]).toBeCloseTo(-Math.PI, 10);
  });
});

describe("cutoffPoints, peak gain and attenuation", () => {
  it("Butterworth is −3.0103 dB at its design cutoff, so cutoffPoints returns it (Butterworth 1930; prewarped as scipy.signal.butter)", () => {
    const lp = design(byName("butter4_lowpass"));
    const [fc, ...rest] = cutoffPoints(lp);
    expect(rest).toEqual([]);
    expect(Math.abs(fc - 100) / 100).toBeLessThanOrEqual(1e-8);
    expect(peakGainDb(lp)).toBeCloseTo(0, 10);
    const hp = design(byName("butter6_highpass_48k"));
    const [fcHp, ...restHp] = cutoffPoints(hp);
    expect(restHp).toEqual([]);
    expect(Math.abs(fcHp - 20) / 20).toBeLessThanOrEqual(1e-8);
  });

  it("the notch (scipy iirnotch(50, 30)) has two −3 dB points f0/Q = 1.667 Hz apart (q = f0/Δf: Orfanidis, Introduction to Signal Processing, 1996, §11.3)", () => {
    const points = cutoffPoints(design(byName("notch50")));
    expect(points).toHaveLength(2);
    expect(points[1] - points[0]).toBeCloseTo(50 / 30, 2);
    expect(Math.sqrt(points[0] * points[1])).toBeCloseTo(50, 1);
  });

  it("the bandpass has two crossings bracketing its band and attenuation is 0 at the peak", () => {
    const bp = design(byName("cheby1_bandpass"));
    const points = cutoffPoints(bp);
    expect(points).toHaveLength(2);
    expect(points[0]).toBeLessThan(100);
    expect(points[1]).toBeGreaterThan(200);
    const [atBand, atDc] = attenuationDb(bp, [150, 1]);
    expect(atBand).toBeGreaterThanOrEqual(-1e-9);
    expect(atBand).toBeLessThan(1.0 + 1e-9);
    expect(atDc).toBeGreaterThan(60);
  });

  it("rejects a drop that is not > 0 dB", () => {
    expect(() => cutoffPoints(design(byName("butter4_lowpass")), { dropDb: 0 })).toThrow(/dropDb/);
  });
});

describe("group delay: published checks and unit-circle zeros", () => {
  it("firwin(51) (symmetric) has group delay (N−1)/2 = 25 samples everywhere, nulls included (Oppenheim & Schafer, Discrete-Time Signal Processing, 3rd ed., §5.7)", () => {
    const fir = design(byName("firwin51"));
    const r = frequencyResponse(fir, freqGrid(1000, 2001, "linear"));
    for (const gd of r.groupDelaySamples) expect(gd).toBeCloseTo(25, 6);
  });

  it("moving average N=20 at 1 kHz: first null at fs/N = 50 Hz, finite magnitude floor and delay (N−1)/2 there (Smith ch.15)", () => {
    const n = 20;
    const ma: FilterDesign = { sampleRateHz: 1000, taps: new Array(n).fill(1 / n), zeros: [], poles: [], gain: 1 };
    const grid = Array.from({ length: 2001 }, (_, i) => (i * 100) / 2000);
    const r = frequencyResponse(ma, grid);
    const firstNull = grid[r.magnitudeDb.findIndex((m) => m < -250)];
    expect(firstNull).toBe(50);
    expect(r.magnitudeDb[1000]).toBeLessThan(-250);
    expect(r.magnitudeDb.every(Number.isFinite)).toBe(true);
    for (const gd of r.groupDelaySamples) expect(gd).toBeCloseTo((n - 1) / 2, 9);
    expect(toMs(r.groupDelaySamples[1000], 1000)).toBeCloseTo(9.5, 9);
  });

  it("notch centre: magnitude stays finite and group delay is continuous through f0 (scipy would return 0 there)", () => {
    const notch = design(byName("notch50"));
    const r = frequencyResponse(notch, [50 - 1e-6, 50, 50 + 1e-6]);
    expect(r.magnitudeDb[1]).toBeLessThan(-200);
    expect(r.magnitudeDb[1]).toBeGreaterThanOrEqual(MAGNITUDE_FLOOR_DB);
    const [left, centre, right] = r.groupDelaySamples;
    expect(Math.abs(centre - (left + right) / 2)).toBeLessThan(1e-7);
  });

  it("Butterworth highpass at exactly 0 Hz (double zero at z = 1): −400 dB floor, finite delay equal to its limit", () => {
    const hp = design(byName("butter6_highpass_48k"));
    const r = frequencyResponse(hp, [0, 1e-3]);
    expect(r.magnitudeDb[0]).toBe(MAGNITUDE_FLOOR_DB);
    expect(r.groupDelaySamples[0]).toBeCloseTo(r.groupDelaySamples[1], 4);
  });
});

describe("with designs from lib/dsp/iir", () => {
  const spec: IirSpec = { kind: "iir", family: "butterworth", response: "lowpass", order: 4, cutoffHz: 100, sampleRateHz: 1000 };

  it("digital and analog Butterworth are both −3.0103 dB at the design cutoff (Butterworth 1930; the bilinear map prewarped at the cutoff, as scipy.signal.butter)", () => {
    const [fc] = cutoffPoints(designIir(spec));
    expect(Math.abs(fc - 100) / 100).toBeLessThanOrEqual(1e-8);
    const analog = analogResponse(analogPrototypeZpk(spec), [100]);
    expect(analog.magnitudeDb[0]).toBeCloseTo(-10 * Math.log10(2), 9);
  });

  it("the analog prototype's DC group delay matches 1/(ωc·sin(π/2N)) = 2.6131/ωc (Σ −Re(p_k)/|p_k|² over its poles; common practice): digital ≈ analog at low f", () => {
    const d = designIir(spec);
    const [gd] = frequencyResponse(d, [0.01]).groupDelaySamples;
    const analogSeconds = 2.6131 / (2 * Math.PI * 100);
    // Prewarping moves the digital corner: at fc/fs = 0.1 the delays differ by a few per cent only.
    expect(Math.abs(gd / 1000 - analogSeconds) / analogSeconds).toBeLessThan(0.05);
  });
});

describe("stability", () => {
  it("FIR is always stable with all poles at the origin", () => {
    expect(stability(design(byName("firwin51")))).toEqual({ stable: true, maxPoleRadius: 0 });
  });

  it("a section with a pole outside the unit circle is unstable; the triangle test agrees (Jackson, Digital Filters and Signal Processing — from memory)", () => {
    const unstable: FilterDesign = { sampleRateHz: 1000, sos: [[1, 0, 0, 1, -1.9, 1.05]], zeros: [], poles: [], gain: 1 };
    const s = stability(unstable);
    expect(s.stable).toBe(false);
    expect(s.maxPoleRadius).toBeCloseTo(Math.sqrt(1.05), 12);
    expect(sectionInStabilityTriangle(-1.9, 1.05)).toBe(false);
    expect(sectionInStabilityTriangle(-1.142981, 0.412802)).toBe(true);
  });
});

describe("bad parameters throw with the allowed range", () => {
  it("rejects designs with both or neither of sos and taps, a0 ≠ 1, bad sample rates and negative frequencies", () => {
    const base = { sampleRateHz: 1000, zeros: [], poles: [], gain: 1 };
    expect(() => frequencyResponse({ ...base }, [1])).toThrow(/exactly one/);
    expect(() => frequencyResponse({ ...base, sos: [[1, 0, 0, 2, 0, 0]] }, [1])).toThrow(/a0 = 1/);
    expect(() => frequencyResponse({ ...base, sampleRateHz: 0, taps: [1] }, [1])).toThrow(/> 0 Hz/);
    expect(() => frequencyResponse({ ...base, taps: [1] }, [-1])).toThrow(/≥ 0 Hz/);
    expect(() => freqGrid(1000, 1, "log")).toThrow(/≥ 2/);
    expect(() => dcGain({ ...base, sos: [[1, 0, 0, 1, -1, 0]] })).toThrow(/pole at z = 1/);
    expect(() => frequencyResponse({ ...base, taps: [0, 0] }, [1])).toThrow(/non-zero/);
    expect(() => frequencyResponse({ ...base, sos: [[0, 0, 0, 1, 0, 0]] }, [1])).toThrow(/all-zero numerator/);
  });
});

describe("freqGrid", () => {
  it("linear spans 0 … fs/2; log spans (fs/2)·1e-4 … just below fs/2", () => {
    const lin = freqGrid(1000, 11, "linear");
    expect(lin[0]).toBe(0);
    expect(lin[10]).toBe(500);
    const log = freqGrid(1000, 5, "log");
    expect(log[0]).toBeCloseTo(0.05, 12);
    expect(log[4]).toBeCloseTo(499.5, 9);
    expect(log[4]).toBeLessThan(500);
  });
});
