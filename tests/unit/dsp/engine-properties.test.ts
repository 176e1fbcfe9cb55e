import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { filterSignal } from "@/lib/dsp/engine/filter-signal";
import { createStreamingFilter, type InitialState } from "@/lib/dsp/engine/streaming-filter";
import type { FilterDesign } from "@/lib/dsp/types";

/** A random stable biquad: conjugate zeros at radius ≤ 1.2, conjugate poles at radius < 0.98. */
const section = fc
  .record({
    gain: fc.double({ min: 0.05, max: 4, noNaN: true }),
    zeroRadius: fc.double({ min: 0, max: 1.2, noNaN: true }),
    zeroAngle: fc.double({ min: 0, max: Math.PI, noNaN: true }),
    poleRadius: fc.double({ min: 0, max: 0.98, noNaN: true }),
    poleAngle: fc.double({ min: 0, max: Math.PI, noNaN: true }),
  })
  .map(({ gain, zeroRadius, zeroAngle, poleRadius, poleAngle }) => [
    gain,
    -2 * gain * zeroRadius * Math.cos(zeroAngle),
    gain * zeroRadius * zeroRadius,
    1,
    -2 * poleRadius * Math.cos(poleAngle),
    poleRadius * poleRadius,
  ]);

const base = { sampleRateHz: 1000, zeros: [], poles: [], gain: 1 };

const design: fc.Arbitrary<FilterDesign> = fc.oneof(
  fc.array(section, { minLength: 1, maxLength: 6 }).map((sos) => ({ ...base, sos })),
  // At least one non-zero tap: a filter whose output is identically zero is refused (runForm).
  fc
    .array(fc.double({ min: -1, max: 1, noNaN: true }), { minLength: 1, maxLength: 40 })
    .filter((taps) => taps.some((t) => t !== 0))
    .map((taps) => ({ ...base, taps })),
);

const samples = (min: number, max: number) =>
  fc.array(fc.double({ min: -10, max: 10, noNaN: true }), { minLength: min, maxLength: max }).map((v) => Float64Array.from(v));

const initial = fc.constantFrom<InitialState>("zero", "step");

/** Split x into consecutive blocks of the given sizes (the last block takes the rest). */
function streamInBlocks(d: FilterDesign, init: InitialState, x: Float64Array, sizes: number[]): Float64Array {
  const f = createStreamingFilter(d, { initial: init });
  const y = new Float64Array(x.length);
  let at = 0;
  for (const size of [...sizes, x.length]) {
    const end = Math.min(x.length, at + size);
    y.set(f.process(x.subarray(at, end)), at);
    at = end;
  }
  return y;
}

describe("streaming filter properties", () => {
  it("block-split streaming is bit-identical to one pass, for any block sizes", () => {
    fc.assert(
      fc.property(design, initial, samples(0, 300), fc.array(fc.nat(70)), (d, init, x, sizes) => {
        expect(streamInBlocks(d, init, x, sizes)).toEqual(filterSignal(d, x, { initial: init }));
      }),
    );
  });

  it("stays bit-identical to one pass when the signal holds NaN and ±Infinity", () => {
    const bad = fc.constantFrom(NaN, Infinity, -Infinity);
    fc.assert(
      fc.property(design, initial, samples(1, 200), fc.array(fc.tuple(fc.nat(199), bad)), fc.array(fc.nat(50)), (d, init, x, hits, sizes) => {
        for (const [i, v] of hits) x[i % x.length] = v;
        expect(streamInBlocks(d, init, x, sizes)).toEqual(filterSignal(d, x, { initial: init }));
      }),
    );
  });

  it("recovers from a non-finite sample: NaN there, then exactly a fresh filter's output", () => {
    const bad = fc.constantFrom(NaN, Infinity, -Infinity);
    fc.assert(
      fc.property(design, initial, samples(2, 200), fc.nat(), fc.integer({ min: 1, max: 3 }), bad, (d, init, x, at, run, v) => {
        const k = at % (x.length - 1);
        const badEnd = Math.min(x.length - 1, k + run);
        x.fill(v, k, badEnd);
        const f = createStreamingFilter(d, { initial: init });
        const y = f.process(x);
        expect(f.faults).toBe(badEnd - k);
        expect(y.subarray(0, k)).toEqual(filterSignal(d, x.subarray(0, k), { initial: init }));
        expect(Array.from(y.subarray(k, badEnd)).every(Number.isNaN)).toBe(true);
        expect(y.subarray(badEnd)).toEqual(filterSignal(d, x.subarray(badEnd), { initial: init }));
      }),
    );
  });

  it("with initial 'step', a constant input gives a constant output from sample 0 (DC gain × input)", () => {
    fc.assert(
      fc.property(design, fc.double({ min: -100, max: 100, noNaN: true }), (d, c) => {
        const dcGain = d.sos
          ? d.sos.reduce((g, [b0, b1, b2, , a1, a2]) => (g * (b0 + b1 + b2)) / (1 + a1 + a2), 1)
          : (d.taps ?? []).reduce((s, t) => s + t, 0);
        const y = filterSignal(d, new Float64Array(200).fill(c), { initial: "step" });
        // Rounding-level drift only: the steady state is exact up to a few ulps, amplified by poles at radius < 0.98.
        const tol = 1e-9 * Math.max(1, Math.abs(c * dcGain));
        for (const v of y) expect(Math.abs(v - c * dcGain)).toBeLessThanOrEqual(tol);
      }),
    );
  });

  it("reset returns to the initial condition and keeps the fault count", () => {
    const d = { ...base, sos: [[0.2, 0.4, 0.2, 1, -0.5, 0.3]] };
    const x = Float64Array.from({ length: 50 }, (_, i) => Math.sin(i / 3) + 2);
    const f = createStreamingFilter(d, { initial: "step" });
    f.process(Float64Array.of(1, NaN, 5));
    f.reset();
    expect(f.process(x)).toEqual(filterSignal(d, x, { initial: "step" }));
    expect(f.faults).toBe(1);
  });

  it("filters in place when out is the input array, also across a non-finite sample", () => {
    fc.assert(
      fc.property(design, initial, samples(1, 100), fc.option(fc.nat(99)), (d, init, x, bad) => {
        if (bad !== null) x[bad % x.length] = NaN;
        const expected = filterSignal(d, x, { initial: init });
        expect(createStreamingFilter(d, { initial: init }).process(x, x)).toEqual(expected);
      }),
    );
  });
});
