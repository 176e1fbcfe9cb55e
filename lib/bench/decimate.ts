import type { ColumnView } from "./ring-buffer";

/** Plot-ready columns: x, then one y column per series with null for gaps (uPlot's AlignedData layout). */
export type PlotColumns = [number[], ...(number | null)[][]];

/**
 * Min/max decimation of rows [from, to) of a view into at most `buckets` buckets: each bucket gives two
 * rows, at its first and middle sample times, holding each series' minimum and maximum in the order
 * they occurred, so every extreme survives (common practice for plotting long series; the perf notes
 * use about 2 points per pixel). A value that is not finite (NaN, or ±∞ from a diverging filter) becomes
 * null in its own series only, so it cannot stretch the shared axis and blank the other traces. Ranges no longer than 2·buckets are copied as they are.
 */
export function decimateMinMax(view: ColumnView, from: number, to: number, buckets: number): PlotColumns {
  if (!Number.isInteger(buckets) || buckets < 1) throw new Error(`buckets must be an integer ≥ 1 (got ${buckets})`);
  const lo = Math.max(0, from);
  const hi = Math.min(view.length, to);
  const n = Math.max(0, hi - lo);
  const xs: number[] = [];
  const ys: (number | null)[][] = Array.from({ length: view.series }, () => []);
  const orNull = (v: number) => (Number.isFinite(v) ? v : null);
  if (n <= 2 * buckets) {
    for (let i = lo; i < hi; i++) {
      xs.push(view.x(i));
      for (let s = 0; s < view.series; s++) ys[s].push(orNull(view.y(s, i)));
    }
    return [xs, ...ys];
  }
  const size = n / buckets;
  for (let b = 0; b < buckets; b++) {
    const start = lo + Math.floor(b * size);
    const end = lo + Math.floor((b + 1) * size);
    if (end <= start) continue;
    xs.push(view.x(start), view.x(start + ((end - start) >> 1)));
    for (let s = 0; s < view.series; s++) {
      let iMin = -1;
      let iMax = -1;
      for (let i = start; i < end; i++) {
        const v = view.y(s, i);
        if (!Number.isFinite(v)) continue;
        if (iMin < 0 || v < view.y(s, iMin)) iMin = i;
        if (iMax < 0 || v > view.y(s, iMax)) iMax = i;
      }
      const col = ys[s];
      if (iMin < 0) col.push(null, null);
      else if (iMin <= iMax) col.push(view.y(s, iMin), view.y(s, iMax));
      else col.push(view.y(s, iMax), view.y(s, iMin));
    }
  }
  return [xs, ...ys];
}
