import { describe, expect, it } from "vitest";
import { designZeros } from "@/lib/dsp/zeros";
import fc from "fast-check";
import { readFileSync } from "node:fs";
import type { Complex } from "@/lib/dsp/types";
import { designIir, analogPrototypeZpk } from "@/lib/dsp/iir/design";
import { buttap } from "@/lib/dsp/iir/prototypes/butter";
import { IIR_FAMILIES, IIR_RESPONSES, MAX_ORDER, type IirSpec } from "@/lib/dsp/iir/spec";

interface Tolerance {
  rootsRelative: number;
  gainRelative: number;
  magnitudeRelative: number;
  roundingFactor: number;
  magnitudeFloor: number;
  sosRelative: number;
}
interface DesignCase {
  spec: IirSpec;
  call: string;
  zeros: Complex[];
  poles: Complex[];
  gain: number;
  sos: number[][];
  analog: { zeros: Complex[]; poles: Complex[]; gain: number };
  freqHz: number[];
  magnitude: number[];
}
interface Fixture {
  tool: string;
  scipyVersion: string;
  tolerance: Tolerance;
  cases: DesignCase[];
}

const fixtureNames = (family: string): string[] =>
  family === "bessel" ? ["phase", "delay", "mag"].map((n) => `bessel-${n}`) : [family];

/** Every scipy case for a family (the Bessel fixtures are split by norm to stay small). */
const load = (family: string): Fixture => {
  const parts = fixtureNames(family).map(
    (name) => JSON.parse(readFileSync(`tests/fixtures/dsp/iir-design-${name}.json`, "utf8")) as Fixture,
  );
  return { ...parts[0], cases: parts.flatMap((p) => p.cases) };
};

const quadAbs = (c0: number, c1: number, c2: number, w: number): number =>
  Math.hypot(c0 + c1 * Math.cos(w) + c2 * Math.cos(2 * w), -c1 * Math.sin(w) - c2 * Math.sin(2 * w));

/** |H(e^{jω})| of a cascade of [b0,b1,b2,1,a1,a2] rows at f Hz (direct evaluation on the unit circle). */
function sosMagnitude(sos: number[][], fHz: number, fs: number): number {
  const w = (2 * Math.PI * fHz) / fs;
  return sos.reduce((mag, [b0, b1, b2, a0, a1, a2]) => (mag * quadAbs(b0, b1, b2, w)) / quadAbs(a0, a1, a2, w), 1);
}

/** Σ over sections of Σ|coeffs|/|poly(e^{jω})| for numerator and denominator: Horner's relative condition number. */
function sosConditioning(sos: number[][], fHz: number, fs: number): number {
  const w = (2 * Math.PI * fHz) / fs;
  return sos.reduce(
    (acc, [b0, b1, b2, a0, a1, a2]) =>
      acc +
      (Math.abs(b0) + Math.abs(b1) + Math.abs(b2)) / quadAbs(b0, b1, b2, w) +
      (Math.abs(a0) + Math.abs(a1) + Math.abs(a2)) / quadAbs(a0, a1, a2, w),
    0,
  );
}

/** Greedy nearest matching of two multisets of complex points; returns the worst relative distance. */
function worstMismatch(ours: Complex[], ref: Complex[]): number {
  expect(ours.length).toBe(ref.length);
  const left = [...ours];
  let worst = 0;
  for (const r of ref) {
    let best = 0;
    let bestDist = Infinity;
    left.forEach((o, i) => {
      const d = Math.hypot(o[0] - r[0], o[1] - r[1]);
      if (d < bestDist) {
        best = i;
        bestDist = d;
      }
    });
    left.splice(best, 1);
    worst = Math.max(worst, bestDist / Math.max(1, Math.hypot(r[0], r[1])));
  }
  return worst;
}

const relErr = (a: number, b: number): number => Math.abs(a - b) / Math.max(Math.abs(b), Number.MIN_VALUE);

describe.each(IIR_FAMILIES)("designIir(%s) against scipy.signal.iirfilter", (family) => {
  const fixture = load(family);
  const tol = fixture.tolerance;
  it("records how it was generated", () => {
    expect(fixture.scipyVersion).toBe("1.10.1");
    expect(fixture.cases.length).toBeGreaterThan(40);
  });
  it.each(fixture.cases.map((c) => [c.call, c] as const))("%s", (_call, c) => {
    const d = designIir(c.spec);
    expect(worstMismatch(d.poles, c.poles)).toBeLessThanOrEqual(tol.rootsRelative);
    expect(worstMismatch(designZeros(d), c.zeros)).toBeLessThanOrEqual(tol.rootsRelative);
    expect(relErr(d.gain, c.gain)).toBeLessThanOrEqual(tol.gainRelative);
    expect(d.sos).toHaveLength(c.sos.length);
    c.sos.forEach((row, i) => {
      const scale = [Math.max(...row.slice(0, 3).map(Math.abs)), Math.max(...row.slice(3).map(Math.abs))];
      row.forEach((v, j) => {
        expect(Math.abs((d.sos ?? [])[i][j] - v), `sos[${i}][${j}]`).toBeLessThanOrEqual(tol.sosRelative * scale[j < 3 ? 0 : 1]);
      });
    });
    c.freqHz.forEach((f, i) => {
      const ref = c.magnitude[i];
      if (ref <= tol.magnitudeFloor) return;
      const ours = sosMagnitude(d.sos ?? [], f, c.spec.sampleRateHz);
      const rounding = tol.roundingFactor * Number.EPSILON * sosConditioning(c.sos, f, c.spec.sampleRateHz);
      expect(Math.abs(ours - ref), `|H| at ${f} Hz`).toBeLessThanOrEqual(ref * (tol.magnitudeRelative + rounding));
    });
    const a = analogPrototypeZpk(c.spec);
    expect(worstMismatch(a.poles, c.analog.poles)).toBeLessThanOrEqual(tol.rootsRelative);
    expect(worstMismatch(a.zeros, c.analog.zeros)).toBeLessThanOrEqual(tol.rootsRelative);
    expect(relErr(a.gain, c.analog.gain)).toBeLessThanOrEqual(tol.gainRelative);
  });
});

const spec = (over: Partial<IirSpec>): IirSpec => ({
  kind: "iir",
  family: "butterworth",
  response: "lowpass",
  order: 2,
  cutoffHz: 100,
  sampleRateHz: 1000,
  ...over,
});
const db = (x: number): number => 20 * Math.log10(x);

describe("check values from scipy and Butterworth's closed forms", () => {
  it("scipy.signal.butter(2, 100, fs=1000): b = [0.067455, 0.134911, 0.067455], a = [1, −1.142981, 0.412802]", () => {
    // Source: scipy 1.10.1 signal.butter(2, 100, fs=1000), printed to 6 decimals.
    const [row] = designIir(spec({})).sos ?? [];
    const expected = [0.067455, 0.134911, 0.067455, 1, -1.142981, 0.412802];
    row.forEach((v, i) => expect(v).toBeCloseTo(expected[i], 6));
  });

  it.each([1, 2, 3, 4, 5, 8, 12])("Butterworth order %i is −3.0103 dB at the cutoff (Butterworth 1930; prewarped)", (order) => {
    for (const [fc, fs] of [[100, 1000], [3, 48000], [450, 1000]] as const) {
      const d = designIir(spec({ order, cutoffHz: fc, sampleRateHz: fs }));
      expect(db(sosMagnitude(d.sos ?? [], fc, fs))).toBeCloseTo(-10 * Math.log10(2), 9);
    }
  });

  it.each([1, 2, 3, 6, 12])("Butterworth analog poles s_k = exp(jπ(2k+N−1)/(2N)), N = %i (Butterworth 1930)", (n) => {
    const expected: Complex[] = Array.from({ length: n }, (_, i) => {
      const k = i + 1;
      const t = (Math.PI * (2 * k + n - 1)) / (2 * n);
      return [Math.cos(t), Math.sin(t)];
    });
    expect(worstMismatch(buttap(n).poles, expected)).toBeLessThan(1e-15);
  });

  it("Chebyshev I: the passband stays in [−rp, 0] dB up to the edge and is −rp at the edge (Williams & Taylor ch. 2)", () => {
    for (const order of [3, 4]) {
      const d = designIir(spec({ family: "chebyshev1", order, cutoffHz: 100, passbandRippleDb: 1 }));
      const mags = Array.from({ length: 200 }, (_, i) => db(sosMagnitude(d.sos ?? [], (100 * i) / 199, 1000)));
      expect(Math.max(...mags)).toBeLessThanOrEqual(1e-9);
      expect(Math.min(...mags)).toBeGreaterThanOrEqual(-1 - 1e-9);
      expect(mags[mags.length - 1]).toBeCloseTo(-1, 9);
    }
  });

  it("Chebyshev II: exactly the stopband attenuation at the stopband edge, at least it beyond (Williams & Taylor ch. 2)", () => {
    for (const order of [3, 4]) {
      const d = designIir(spec({ family: "chebyshev2", order, cutoffHz: 200, stopbandAttenuationDb: 40 }));
      expect(db(sosMagnitude(d.sos ?? [], 200, 1000))).toBeCloseTo(-40, 8);
      for (let f = 201; f < 500; f += 7) expect(db(sosMagnitude(d.sos ?? [], f, 1000))).toBeLessThanOrEqual(-40 + 1e-9);
    }
  });
});

describe("properties over random valid specs", () => {
  const arbSpec = fc
    .record({
      family: fc.constantFrom(...IIR_FAMILIES),
      response: fc.constantFrom(...IIR_RESPONSES),
      order: fc.integer({ min: 1, max: 12 }),
      fs: fc.double({ min: 1, max: 1e6, noNaN: true }),
      lo: fc.double({ min: 0.001, max: 0.98, noNaN: true }),
      width: fc.double({ min: 0.001, max: 0.5, noNaN: true }),
      rp: fc.double({ min: 0.01, max: 3, noNaN: true }),
      extra: fc.double({ min: 1, max: 100, noNaN: true }),
      norm: fc.constantFrom("phase" as const, "delay" as const, "mag" as const),
    })
    .map(({ family, response, order, fs, lo, width, rp, extra, norm }): IirSpec => {
      const band = response === "bandpass" || response === "bandstop";
      const hi = Math.min(lo + width, 0.99);
      return {
        kind: "iir",
        family,
        response,
        order: Math.min(order, MAX_ORDER[response]),
        cutoffHz: band ? [(lo * fs) / 2, (hi * fs) / 2] : (lo * fs) / 2,
        sampleRateHz: fs,
        passbandRippleDb: rp,
        stopbandAttenuationDb: rp + extra,
        besselNorm: norm,
      };
    })
    .filter((s) => typeof s.cutoffHz === "number" || s.cutoffHz[0] < s.cutoffHz[1]);

  it("all poles are inside the unit circle and the response is finite", () => {
    fc.assert(
      fc.property(arbSpec, (s) => {
        const d = designIir(s);
        for (const [re, im] of d.poles) expect(Math.hypot(re, im)).toBeLessThan(1);
        for (let i = 0; i <= 64; i++) {
          expect(Number.isFinite(sosMagnitude(d.sos ?? [], (s.sampleRateHz * i) / 128, s.sampleRateHz))).toBe(true);
        }
      }),
      { numRuns: 300 },
    );
  });
});
