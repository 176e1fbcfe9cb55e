import { describe, expect, it } from "vitest";
import { designZeros } from "@/lib/dsp/zeros";
import fixture from "../../fixtures/dsp/designs-firwin.json";
import { frequencyResponse } from "@/lib/dsp/analysis";
import { cAbs, cSub } from "@/lib/dsp/complex";
import { designFilter } from "@/lib/dsp/design";
import { emaAlpha } from "@/lib/dsp/ema";
import { firstDifferenceTaps } from "@/lib/dsp/fir/differentiator";
import { movingAverage } from "@/lib/dsp/fir/moving-average";
import { windowedSinc, type FirResponse } from "@/lib/dsp/fir/windowed-sinc";
import { besselI0, firWindow, kaiserBeta, type FirWindow } from "@/lib/dsp/fir/windows";
import { designFromTaps } from "@/lib/dsp/transfer";
import type { FirSpec } from "@/lib/dsp/spec";
import type { Complex } from "@/lib/dsp/types";

const TWO_PI = 2 * Math.PI;

/** Every expected root has a distinct actual root within tol·max(1, |r|). */
function expectSameRoots(actual: Complex[], expected: Complex[], tol: number): void {
  expect(actual).toHaveLength(expected.length);
  const left = [...actual];
  for (const r of expected) {
    let best = 0;
    left.forEach((x, i) => {
      if (cAbs(cSub(x, r)) < cAbs(cSub(left[best], r))) best = i;
    });
    expect(cAbs(cSub(left[best], r))).toBeLessThanOrEqual(tol * Math.max(1, cAbs(r)));
    left.splice(best, 1);
  }
}

describe("windowed-sinc FIR against scipy.signal.firwin", () => {
  for (const c of fixture.cases) {
    it(c.call, () => {
      const spec = c.spec as FirSpec;
      const design = designFilter(spec);
      const taps = design.taps ?? [];
      expect(taps).toHaveLength(c.taps.length);
      taps.forEach((t, i) => expect(Math.abs(t - c.taps[i])).toBeLessThanOrEqual(fixture.tolerance.tapsAbsolute));
      if ("numpyRoots" in c && "polishedRoots" in c) {
        // FIR zeros = roots of the taps polynomial, checked against numpy.roots refined by extended-precision
        // Newton steps, and against raw numpy.roots unless the end taps are rounding residue (blackman ends,
        // ~1e-18, make numpy's companion matrix badly scaled; see the generator).
        const tol = fixture.tolerance;
        expectSameRoots(designZeros(design), c.polishedRoots as Complex[], tol.rootsRelative);
        const maxTap = Math.max(...taps.map(Math.abs));
        if (taps[0] === 0 || Math.abs(taps[0]) > tol.endTapFloor * maxTap) {
          expectSameRoots(designZeros(design), c.numpyRoots as Complex[], tol.rootsRelative);
        }
        expect(design.poles).toHaveLength(taps.length - 1);
        // gain = first nonzero tap (hann and blackman end taps are exactly 0; scipy tf2zpk also trims them)
        expect(design.gain).toBe(taps.find((t) => t !== 0));
      }
    });
  }

  for (const k of fixture.kaiserBeta) {
    it(`${k.call} = ${k.beta}`, () => {
      expect(kaiserBeta(k.attenuationDb)).toBeCloseTo(k.beta, 13);
      if (k.beta !== 0) expect(Math.abs(kaiserBeta(k.attenuationDb) / k.beta - 1)).toBeLessThanOrEqual(fixture.tolerance.betaRelative);
    });
  }
});

describe("windowed-sinc formula checks", () => {
  it("symmetric N-tap FIR has group delay (N − 1)/2 samples (Oppenheim & Schafer, Discrete-Time Signal Processing, 3rd ed., §5.7)", () => {
    for (const taps of [10, 31]) {
      const design = designFilter({ kind: "fir", response: "lowpass", window: "hamming", taps, cutoffHz: 100, sampleRateHz: 1000 });
      const { groupDelaySamples } = frequencyResponse(design, [1, 20, 50, 90]);
      groupDelaySamples.forEach((d) => expect(d).toBeCloseTo((taps - 1) / 2, 9));
    }
  });

  it("unit gain at the scaling frequency: DC (lowpass, bandstop), Nyquist (highpass), band centre (bandpass)", () => {
    const fs = 1000;
    const gainAt = (response: FirResponse, cutoffHz: number | [number, number], f: number) =>
      cAbs(
        windowedSinc({ response, window: "blackman", taps: 41, cutoffHz, sampleRateHz: fs }).reduce(
          (acc: Complex, h, n) => [acc[0] + h * Math.cos((TWO_PI * f * n) / fs), acc[1] - h * Math.sin((TWO_PI * f * n) / fs)],
          [0, 0],
        ),
      );
    expect(gainAt("lowpass", 100, 0)).toBeCloseTo(1, 14);
    expect(gainAt("bandstop", [100, 200], 0)).toBeCloseTo(1, 14);
    expect(gainAt("highpass", 100, 500)).toBeCloseTo(1, 14);
    expect(gainAt("bandpass", [100, 200], 150)).toBeCloseTo(1, 14);
  });

  it("refuses an even tap count for highpass and bandstop, as scipy does", () => {
    expect(() => windowedSinc({ response: "highpass", window: "hann", taps: 10, cutoffHz: 100, sampleRateHz: 1000 })).toThrow(
      /highpass FIR needs an odd number of taps.*got 10/,
    );
    expect(() =>
      windowedSinc({ response: "bandstop", window: "hann", taps: 10, cutoffHz: [100, 200], sampleRateHz: 1000 }),
    ).toThrow(/odd number of taps/);
  });

  it("refuses cutoffs outside (0, fs/2) and a kaiser window without β", () => {
    expect(() => windowedSinc({ response: "lowpass", window: "hann", taps: 9, cutoffHz: 500, sampleRateHz: 1000 })).toThrow(/Nyquist frequency 500 Hz/);
    expect(() => windowedSinc({ response: "bandpass", window: "hann", taps: 9, cutoffHz: [200, 100], sampleRateHz: 1000 })).toThrow(/increasing/);
    expect(() => firWindow("kaiser", 9)).toThrow(/kaiserBeta/);
  });

  it("windows: symmetric, peak 1 at the centre for odd N, N = 1 gives [1]", () => {
    for (const w of ["rectangular", "hann", "hamming", "blackman", "kaiser"] as FirWindow[]) {
      const win = firWindow(w, 9, 6);
      win.forEach((v, i) => expect(v).toBeCloseTo(win[8 - i], 15));
      expect(win[4]).toBeCloseTo(1, 15);
      expect(firWindow(w, 1, 6)).toEqual([1]);
    }
  });

  it("I₀ matches tabulated values (Abramowitz & Stegun Table 9.8: I₀(1) = 1.266065878, e⁻⁵·I₀(5) = 0.1835408126)", () => {
    expect(besselI0(0)).toBe(1);
    expect(besselI0(1)).toBeCloseTo(1.266065878, 9);
    expect(Math.exp(-5) * besselI0(5)).toBeCloseTo(0.1835408126, 10);
  });
});

describe("moving average", () => {
  it("H(f) = sin(πfN/fs)/(N·sin(πf/fs)) in magnitude; first null at fs/N (S. W. Smith ch. 15; Oppenheim & Schafer, Discrete-Time Signal Processing, 3rd ed., §5.7)", () => {
    const fs = 1000;
    const n = 20;
    const design = designFilter({ kind: "moving-average", length: n, sampleRateHz: fs });
    const freqs = [1, 7.5, 22.2, 31, 49.9, 133, 499];
    const { magnitudeDb } = frequencyResponse(design, freqs);
    freqs.forEach((f, i) => {
      const expected = Math.abs(Math.sin((Math.PI * f * n) / fs) / (n * Math.sin((Math.PI * f) / fs)));
      expect(10 ** (magnitudeDb[i] / 20)).toBeCloseTo(expected, 12);
    });
    const nulls = frequencyResponse(design, [fs / n, (2 * fs) / n, (3 * fs) / n]).magnitudeDb;
    nulls.forEach((db) => expect(db).toBeLessThan(-250));
  });

  it("zeros are e^{j2πk/N}, k = 1 … N−1, exact conjugate pairs; N − 1 poles at the origin; gain 1/N", () => {
    for (const n of [1, 2, 5, 8]) {
      const m = movingAverage(n);
      expect(m.zeros).toHaveLength(n - 1);
      expect(m.poles).toHaveLength(n - 1);
      expect(m.gain).toBe(1 / n);
      for (let k = 1; k < n; k++) {
        const target: Complex = [Math.cos((TWO_PI * k) / n), Math.sin((TWO_PI * k) / n)];
        expect(m.zeros.some((z) => cAbs(cSub(z, target)) < 1e-15)).toBe(true);
      }
      m.zeros.forEach((z) => expect(m.zeros.some((w) => w[0] === z[0] && w[1] === -z[1])).toBe(true));
    }
  });

  it("agrees with the roots of its own taps (designZeros of the taps) for N = 6", () => {
    expectSameRoots(movingAverage(6).zeros, designZeros(designFromTaps(new Array(6).fill(1 / 6), 1000)), 1e-12);
  });
});

describe("first-difference differentiator and EMA", () => {
  it("taps [fs, −fs]; |H(f)| = 2·fs·sin(πf/fs), 0.9836 of the ideal 2πf at fs/10 (closed form of the first difference; common practice)", () => {
    const fs = 1000;
    expect(firstDifferenceTaps(fs)).toEqual([1000, -1000]);
    const design = designFilter({ kind: "differentiator", sampleRateHz: fs });
    expect(designZeros(design)).toEqual([[1, 0]]);
    const [db] = frequencyResponse(design, [100]).magnitudeDb;
    expect(10 ** (db / 20)).toBeCloseTo(2 * fs * Math.sin(Math.PI / 10), 9);
    expect(10 ** (db / 20) / (TWO_PI * 100)).toBeCloseTo(0.9836, 4);
  });

  it("EMA α = 1 − e^{−2π·fc/fs}: fs = 1 kHz, fc = 10 Hz → α = 0.060899 and −3.009 dB at fc (common practice: the ZOH image of a first-order low-pass)", () => {
    expect(emaAlpha(10, 1000)).toBeCloseTo(0.060899, 6);
    const design = designFilter({ kind: "ema", cutoffHz: 10, sampleRateHz: 1000 });
    expect(design.sos).toHaveLength(1);
    const [db] = frequencyResponse(design, [10]).magnitudeDb;
    expect(db).toBeCloseTo(-3.009, 3);
    expect(frequencyResponse(design, [0]).magnitudeDb[0]).toBeCloseTo(0, 12);
  });
});
