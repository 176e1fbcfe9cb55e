import { describe, expect, it } from "vitest";
import { designZeros } from "@/lib/dsp/zeros";
import fixture from "../../fixtures/dsp/designs-rbj.json";
import { frequencyResponse } from "@/lib/dsp/analysis";
import { rbjBiquad, type BiquadParams } from "@/lib/dsp/biquad";
import { designFilter } from "@/lib/dsp/design";
import type { BiquadSpec } from "@/lib/dsp/spec";

const linear = (db: number) => 10 ** (db / 20);

describe("cookbook biquads against the Audio EQ Cookbook formulas evaluated independently in numpy (W3C WG Note 2021)", () => {
  for (const c of fixture.cases) {
    const s = c.spec as BiquadSpec;
    it(`${s.shape} f0=${s.centerHz} Hz Q=${s.q} gain=${s.gainDb ?? "-"} dB fs=${s.sampleRateHz} Hz`, () => {
      const design = designFilter(s);
      expect(design.sos).toHaveLength(1);
      const row = design.sos?.[0] ?? [];
      row.forEach((v, i) => expect(Math.abs(v - c.sos[i])).toBeLessThanOrEqual(fixture.tolerance.coefficientAbsolute));
      const [db] = frequencyResponse(design, [s.centerHz]).magnitudeDb;
      if (c.magnitudeAtCenter > 1e-12) {
        expect(Math.abs(linear(db) / c.magnitudeAtCenter - 1)).toBeLessThanOrEqual(fixture.tolerance.magnitudeRelative);
      }
    });
  }
});

describe("published check values", () => {
  it("LPF f0 = 100 Hz, fs = 1 kHz, Q = 1/√2 equals butter(2, 100, fs=1000): b = [0.067455, 0.134911, 0.067455], a = [1, −1.142981, 0.412802] (scipy.signal.butter values; the cookbook LPF at Q = 1/√2 is the bilinear Butterworth)", () => {
    const row = rbjBiquad({ shape: "lowpass", centerHz: 100, q: Math.SQRT1_2, sampleRateHz: 1000 });
    [0.067455, 0.134911, 0.067455, 1, -1.142981, 0.412802].forEach((v, i) => expect(row[i]).toBeCloseTo(v, 6));
    const butter = designFilter({ kind: "iir", family: "butterworth", response: "lowpass", order: 2, cutoffHz: 100, sampleRateHz: 1000 });
    butter.sos?.[0].forEach((v, i) => expect(row[i]).toBeCloseTo(v, 12));
  });

  it("notch f0 = 50 Hz, fs = 1 kHz, Q = 30 (cookbook Q): b = [0.994876, −1.892367, 0.994876], a = [1, −1.892367, 0.989752] (the Audio EQ Cookbook formulas, R. Bristow-Johnson, W3C Working Group Note 2021, evaluated with α = sin(w0)/60)", () => {
    // scipy.signal.iirnotch(50, 30, fs=1000) gives b = [0.994791, −1.892205, 0.994791] instead: it reads Q as
    // f0/bandwidth with the Orfanidis bandwidth definition, not the cookbook's α = sin(w0)/(2Q).
    const row = rbjBiquad({ shape: "notch", centerHz: 50, q: 30, sampleRateHz: 1000 });
    [0.994876, -1.892367, 0.994876, 1, -1.892367, 0.989752].forEach((v, i) => expect(row[i]).toBeCloseTo(v, 6));
  });
});

describe("cookbook properties", () => {
  const fs = 48000;
  const at = (p: BiquadParams, freqs: number[]) =>
    frequencyResponse(designFilter({ kind: "biquad", ...p }), freqs).magnitudeDb;

  it("peaking: gainDb at f0 and 0 dB at DC and Nyquist", () => {
    for (const g of [-12, 6]) {
      const [dc, center, nyq] = at({ shape: "peaking", centerHz: 1000, q: 2, gainDb: g, sampleRateHz: fs }, [0, 1000, fs / 2]);
      expect(center).toBeCloseTo(g, 10);
      expect(dc).toBeCloseTo(0, 10);
      expect(nyq).toBeCloseTo(0, 10);
    }
  });

  it("shelves: low shelf gainDb at DC and 0 dB at Nyquist, high shelf the reverse; gainDb/2 at f0", () => {
    const low = at({ shape: "lowshelf", centerHz: 500, q: Math.SQRT1_2, gainDb: 9, sampleRateHz: fs }, [0, 500, fs / 2]);
    expect(low[0]).toBeCloseTo(9, 10);
    expect(low[1]).toBeCloseTo(4.5, 10);
    expect(low[2]).toBeCloseTo(0, 10);
    const high = at({ shape: "highshelf", centerHz: 5000, q: Math.SQRT1_2, gainDb: -6, sampleRateHz: fs }, [0, 5000, fs / 2]);
    expect(high[0]).toBeCloseTo(0, 10);
    expect(high[1]).toBeCloseTo(-3, 10);
    expect(high[2]).toBeCloseTo(-6, 10);
  });

  it("bandpass: 0 dB peak at f0; notch: a null at f0; high-pass: 0 dB at Nyquist", () => {
    expect(at({ shape: "bandpass", centerHz: 2000, q: 5, sampleRateHz: fs }, [2000])[0]).toBeCloseTo(0, 10);
    expect(at({ shape: "notch", centerHz: 60, q: 10, sampleRateHz: fs }, [60])[0]).toBeLessThan(-200);
    expect(at({ shape: "highpass", centerHz: 300, q: 0.5, sampleRateHz: fs }, [fs / 2])[0]).toBeCloseTo(0, 10);
  });

  it("zeros and poles are the roots of the section's numerator and denominator", () => {
    const d = designFilter({ kind: "biquad", shape: "notch", centerHz: 50, q: 30, sampleRateHz: 1000 });
    designZeros(d).forEach(([re, im]) => expect(Math.hypot(re, im)).toBeCloseTo(1, 14));
    d.poles.forEach(([re, im]) => expect(Math.hypot(re, im)).toBeCloseTo(Math.sqrt(0.989752), 6));
  });

  it("refuses f0 at or above Nyquist, q ≤ 0 and a missing gain for peaking", () => {
    expect(() => rbjBiquad({ shape: "lowpass", centerHz: 500, q: 1, sampleRateHz: 1000 })).toThrow(/Nyquist frequency 500 Hz/);
    expect(() => rbjBiquad({ shape: "lowpass", centerHz: 100, q: 0, sampleRateHz: 1000 })).toThrow(/q must be a finite number above 0/);
    expect(() => rbjBiquad({ shape: "peaking", centerHz: 100, q: 1, sampleRateHz: 1000 })).toThrow(/gainDb .* required/);
  });
});
