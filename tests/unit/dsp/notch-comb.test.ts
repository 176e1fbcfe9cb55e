import fc from "fast-check";
import { describe, expect, it } from "vitest";
import fixture from "../../fixtures/dsp/designs-notch-comb.json";
import { cutoffPoints, dcGain, frequencyResponse, stability } from "@/lib/dsp/analysis";
import { combDesign, combOrder } from "@/lib/dsp/comb";
import { cAbs, cSub } from "@/lib/dsp/complex";
import { designFilter } from "@/lib/dsp/design";
import { filterSpecSchema } from "@/lib/dsp/filter-spec";
import type { CombSpec } from "@/lib/dsp/comb-spec";
import type { NotchSpec } from "@/lib/dsp/notch-spec";
import { polyEval } from "@/lib/dsp/poly";
import type { Complex } from "@/lib/dsp/types";

const tol = fixture.tolerance.coefficientAbsolute;
const close = (ours: number[], theirs: number[]) => {
  expect(ours).toHaveLength(theirs.length);
  ours.forEach((v, i) => expect(Math.abs(v - theirs[i])).toBeLessThanOrEqual(tol));
};

describe(`notch and peak in the bandwidth convention against scipy ${fixture.scipyVersion} iirnotch / iirpeak`, () => {
  it.each(fixture.notches.map((c) => [c.call, c] as const))("%s", (_call, c) => {
    const d = designFilter(c.spec as NotchSpec);
    expect(d.sos).toHaveLength(1);
    const row = d.sos?.[0] ?? [];
    close(row.slice(0, 3), c.b);
    close(row.slice(3), c.a);
  });

  it("q is the centre over the −3 dB bandwidth: the two −3 dB points of a notch lie f0/q apart, centred on f0 in tan(πf/fs)", () => {
    // Orfanidis, Introduction to Signal Processing (1996), §11.3: the band edges ω1, ω2 satisfy
    // Δω = ω2 − ω1 with the bilinear-warped centre tan²(ω0/2) = tan(ω1/2)·tan(ω2/2) (eq. 11.3.3, from memory).
    const fs = 1000;
    for (const [f0, q] of [[50, 30], [120, 4], [300, 2]]) {
      const d = designFilter({ kind: "notch", shape: "notch", centerHz: f0, q, sampleRateHz: fs });
      const [f1, f2] = cutoffPoints(d);
      expect(f2 - f1).toBeCloseTo(f0 / q, 5);
      const t = (f: number) => Math.tan((Math.PI * f) / fs);
      expect(t(f1) * t(f2)).toBeCloseTo(t(f0) ** 2, 9);
    }
  });

  it("the notch is 0 at f0 and 1 at DC and Nyquist; the peak is 1 at f0 and 0 at DC and Nyquist", () => {
    const spec = { centerHz: 60, q: 10, sampleRateHz: 1000 };
    const notch = frequencyResponse(designFilter({ kind: "notch", shape: "notch", ...spec }), [0, 60, 500]).magnitudeDb;
    const peak = frequencyResponse(designFilter({ kind: "notch", shape: "peak", ...spec }), [0, 60, 500]).magnitudeDb;
    expect(notch[0]).toBeCloseTo(0, 12);
    expect(notch[1]).toBeLessThan(-250);
    expect(notch[2]).toBeCloseTo(0, 12);
    expect(peak[0]).toBeLessThan(-250);
    expect(peak[1]).toBeCloseTo(0, 12);
    expect(peak[2]).toBeLessThan(-250);
  });

  it("refuses a bandwidth that reaches Nyquist and a q out of range, naming the fix", () => {
    const bad = filterSpecSchema.safeParse({ kind: "notch", shape: "notch", centerHz: 200, q: 0.3, sampleRateHz: 1000 });
    expect(bad.success).toBe(false);
    expect(bad.error?.issues[0].message).toMatch(/bandwidth \(centre frequency \/ Q = 666\.6+\d* Hz\) must be below half the sample rate \(500 Hz\); raise Q above 0\.4/);
    expect(filterSpecSchema.safeParse({ kind: "notch", shape: "peak", centerHz: 50, q: 0, sampleRateHz: 1000 }).success).toBe(false);
    expect(filterSpecSchema.safeParse({ kind: "notch", shape: "peak", centerHz: 50, q: 1001, sampleRateHz: 1000 }).success).toBe(false);
  });
});

describe(`comb against scipy ${fixture.scipyVersion} iircomb`, () => {
  it.each(fixture.combs.map((c) => [c.call, c] as const))("%s", (_call, c) => {
    const d = designFilter(c.spec as CombSpec);
    close(d.ba?.b ?? [], c.b);
    close(d.ba?.a ?? [], c.a);
    expect(stability(d).stable).toBe(true);
  });

  it.each(fixture.refusedCombs.map((c) => [c.call, c] as const))("%s is refused as scipy refuses it, with the nearest fundamentals that work", (_call, c) => {
    const parsed = filterSpecSchema.safeParse(c.spec);
    expect(parsed.success).toBe(false);
    const f0 = c.spec.fundamentalHz;
    const fs = c.spec.sampleRateHz;
    const shown = (f: number) => Number(f.toPrecision(6));
    expect(parsed.error?.issues.map((i) => i.message).join("\n")).toContain(
      `the nearest fundamentals that divide ${fs} Hz are ${shown(fs / Math.ceil(fs / f0))} Hz and ${shown(fs / Math.floor(fs / f0))} Hz`,
    );
  });

  it("refuses q ≤ 1 (notches as wide as their spacing) and a delay beyond the limit", () => {
    expect(filterSpecSchema.safeParse({ kind: "comb", shape: "notch", fundamentalHz: 50, q: 1, sampleRateHz: 1000 }).success).toBe(false);
    const long = filterSpecSchema.safeParse({ kind: "comb", shape: "notch", fundamentalHz: 1, q: 30, sampleRateHz: 1000 });
    expect(long.error?.issues[0].message).toMatch(/1000 samples of delay; at most 128/);
  });
});

describe("comb properties (fast-check)", () => {
  const arbComb = fc.record({
    n: fc.integer({ min: 2, max: 128 }),
    fs: fc.constantFrom(100, 1000, 2000, 5000, 44100),
    q: fc.double({ min: 1.5, max: 1000, noNaN: true }),
  });

  it("a notch comb has a zero on every harmonic k·f0, k = 0 … N − 1, and |H| = 0 there", () => {
    fc.assert(
      fc.property(arbComb, ({ n, fs, q }) => {
        const f0 = fs / n;
        if (combOrder(f0, fs) !== n) return;
        const d = combDesign("notch", f0, q, fs);
        for (let k = 0; k < n; k++) {
          const target: Complex = [Math.cos((2 * Math.PI * k) / n), Math.sin((2 * Math.PI * k) / n)];
          const nearest = Math.min(...d.zeros.map((z) => cAbs(cSub(z, target))));
          expect(nearest).toBeLessThan(1e-12);
          // and the numerator polynomial vanishes there (b in descending powers of z is b[0]·zᴺ + b[N])
          expect(cAbs(polyEval(d.ba.b, target))).toBeLessThan(1e-12);
        }
        const harmonics = Array.from({ length: Math.floor(n / 2) + 1 }, (_, k) => k * f0);
        frequencyResponse({ sampleRateHz: fs, ba: d.ba, poles: d.poles, gain: d.gain }, harmonics).magnitudeDb.forEach((db) =>
          expect(db).toBeLessThan(-200),
        );
      }),
      { numRuns: 60 },
    );
  });

  it("a peak comb passes every harmonic at 0 dB and DC, and its poles sit on the harmonics inside the unit circle", () => {
    fc.assert(
      fc.property(arbComb, ({ n, fs, q }) => {
        const f0 = fs / n;
        if (combOrder(f0, fs) !== n) return;
        const design = { sampleRateHz: fs, ...combDesign("peak", f0, q, fs) };
        expect(dcGain(design)).toBeCloseTo(1, 12);
        const harmonics = Array.from({ length: Math.floor(n / 2) + 1 }, (_, k) => k * f0);
        frequencyResponse(design, harmonics).magnitudeDb.forEach((db) => expect(Math.abs(db)).toBeLessThan(1e-9));
        expect(stability(design).maxPoleRadius).toBeLessThan(1);
      }),
      { numRuns: 60 },
    );
  });
});
