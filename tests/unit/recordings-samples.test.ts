import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { designFilter, filterSignal } from "@/lib/dsp";
import { decodeSamples, encodeSamples } from "@/lib/recordings";
import { formatDuration } from "@/lib/recordings/format";
import { finiteRuns, longestRun, replayThrough } from "@/lib/recordings/replay";
import { humChain } from "./coefficients-support";

describe("sample bytes", () => {
  it("round-trips any float64, NaN included, as little-endian bytes", () => {
    fc.assert(
      fc.property(fc.array(fc.double()), (values) => {
        const back = decodeSamples(encodeSamples(Float64Array.from(values)));
        expect([...back].every((v, i) => Object.is(v, values[i]))).toBe(true);
      }),
    );
  });

  it("writes the least significant byte first (1.0 = 00 00 00 00 00 00 f0 3f)", () => {
    expect([...encodeSamples(Float64Array.of(1))]).toEqual([0, 0, 0, 0, 0, 0, 0xf0, 0x3f]);
  });

  it("decodes from a view at an odd offset and refuses a ragged length", () => {
    const bytes = new Uint8Array(17);
    bytes.set(encodeSamples(Float64Array.of(2, -3)), 1);
    expect([...decodeSamples(bytes.subarray(1))]).toEqual([2, -3]);
    expect(() => decodeSamples(new Uint8Array(7))).toThrow(/multiple of 8/);
  });
});

describe("offline replay", () => {
  const design = designFilter({ kind: "iir", family: "butterworth", response: "lowpass", order: 2, cutoffHz: 100, sampleRateHz: 1000 });

  it("finds the stretches between missing samples", () => {
    const x = Float64Array.of(NaN, 1, 2, NaN, NaN, 3, 4, 5);
    expect(finiteRuns(x)).toEqual([{ from: 1, to: 3 }, { from: 5, to: 8 }]);
    expect(longestRun(x)).toEqual({ from: 5, to: 8 });
    expect(longestRun(Float64Array.of(NaN))).toEqual({ from: 0, to: 0 });
  });

  it("filters each stretch from the steady state of its first sample and keeps gaps NaN", () => {
    const x = Float64Array.of(2, 2, 2, NaN, 5, 5, 6);
    const y = replayThrough(design, x);
    expect(y[0]).toBeCloseTo(2, 12);
    expect(y[2]).toBeCloseTo(2, 12);
    expect(Number.isNaN(y[3])).toBe(true);
    expect(y[4]).toBeCloseTo(5, 12);
    expect([...y.subarray(4)]).toEqual([...filterSignal(design, x.subarray(4), { initial: "step" })]);
  });
});

describe("offline replay through a chain", () => {
  it("runs the chain over each stretch, from the steady state of its first sample", () => {
    const chain = designFilter(humChain);
    const x = Float64Array.from({ length: 400 }, (_, n) => (n === 150 ? NaN : 3 + Math.sin((2 * Math.PI * 50 * n) / 1000)));
    const y = replayThrough(chain, x);
    expect(Number.isNaN(y[150])).toBe(true);
    expect([...y.subarray(0, 150)]).toEqual([...filterSignal(chain, x.subarray(0, 150), { initial: "step" })]);
    expect([...y.subarray(151)]).toEqual([...filterSignal(chain, x.subarray(151), { initial: "step" })]);
    expect(y[151]).toBeCloseTo(x[151], 12); // settled: the chain's DC gain is 1 (notches and a Butterworth low-pass)
  });
});

describe("formatDuration", () => {
  it("reads in ms, s, min and h", () => {
    expect([0.85, 12.5, 200, 3900].map(formatDuration)).toEqual(["850 ms", "12.5 s", "3 min 20 s", "1 h 5 min"]);
  });
});
