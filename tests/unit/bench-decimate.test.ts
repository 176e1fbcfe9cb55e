import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { decimateMinMax } from "@/lib/bench/decimate";
import type { ColumnView } from "@/lib/bench/ring-buffer";

function view(ys: number[][]): ColumnView {
  return { length: ys[0].length, series: ys.length, x: (i) => i / 10, y: (s, i) => ys[s][i] };
}

const finiteList = fc.array(fc.double({ min: -1e6, max: 1e6, noNaN: true }), { minLength: 1, maxLength: 2000 });

describe("min/max decimation", () => {
  it("copies a range no longer than two points per bucket as it is", () => {
    const [x, y] = decimateMinMax(view([[3, 1, 2]]), 0, 3, 2);
    expect(x).toEqual([0, 0.1, 0.2]);
    expect(y).toEqual([3, 1, 2]);
  });

  it("keeps every bucket's minimum and maximum in the order they occurred", () => {
    const ys = [[0, 5, -3, 1, 2, 9, -1, 4, 0, 0, 7, -8]];
    const [x, y] = decimateMinMax(view(ys), 0, 12, 3);
    expect(y).toEqual([5, -3, 9, -1, 7, -8]);
    expect(x).toEqual([0, 0.2, 0.4, 0.6, 0.8, 1]);
  });

  it("always keeps the global extremes and stays within 2 points per bucket (property)", () => {
    fc.assert(
      fc.property(finiteList, fc.integer({ min: 1, max: 400 }), (values, buckets) => {
        const [x, y] = decimateMinMax(view([values]), 0, values.length, buckets);
        const kept = y as number[];
        expect(Math.min(...kept)).toBe(Math.min(...values));
        expect(Math.max(...kept)).toBe(Math.max(...values));
        expect(x.length).toBeLessThanOrEqual(Math.max(values.length <= 2 * buckets ? values.length : 2 * buckets, 0));
        for (let i = 1; i < x.length; i++) expect(x[i]).toBeGreaterThanOrEqual(x[i - 1]);
      }),
    );
  });

  it("treats each series on its own and turns NaN gaps into null", () => {
    const ys = [
      [1, 2, 3, 4, 5, 6, 7, 8],
      [NaN, NaN, NaN, NaN, 1, -1, 0, 0],
    ];
    const [, a, b] = decimateMinMax(view(ys), 0, 8, 2);
    expect(a).toEqual([1, 4, 5, 8]);
    expect(b).toEqual([null, null, 1, -1]);
  });

  it("drops the ±∞ of a diverging trace in that trace only, copied or decimated, so the axis stays finite", () => {
    const ys = [
      [1, 2, 3, 4, 5, 6, 7, 8],
      [1, 10, Infinity, -Infinity, Infinity, 1e300, NaN, 2],
    ];
    const [, a, b] = decimateMinMax(view(ys), 0, 8, 2);
    expect(a).toEqual([1, 4, 5, 8]);
    expect(b).toEqual([1, 10, 1e300, 2]);
    const [, rawCopy, divergingCopy] = decimateMinMax(view(ys), 0, 8, 4);
    expect(rawCopy).toEqual(ys[0]);
    expect(divergingCopy).toEqual([1, 10, null, null, null, 1e300, null, 2]);
  });

  it("refuses a bucket count below 1", () => {
    expect(() => decimateMinMax(view([[1, 2]]), 0, 2, 0)).toThrow(/buckets must be an integer ≥ 1/);
  });
});
