import type { Complex, FilterDesign } from "../types";
import { LOG_GRID_DECADES, LOG_GRID_TOP_FRACTION } from "./grid";

/** Limits of the root-aware grid (product choices). */
export const RESPONSE_GRID_LIMITS = {
  /** A zero or pole within this of the unit circle (|1 − r|) gets extra points around its angle. */
  nearCircle: 0.1,
  /** At most this many roots (the closest to the circle first) get extra points, so the grid stays bounded. */
  maxRoots: 64,
  /** Halvings of the local grid spacing sampled on each side of a root's angle (2^−24 of the spacing at the finest). */
  halvings: 24,
  /** Multiples of a root's own width |1 − r|·fs/2π sampled on each side of its angle. */
  widths: [0.25, 0.5, 1, 2, 4] as readonly number[],
} as const;

/** Frequency of the angle of z in Hz, folded into [0, fs/2] (a real filter's response is symmetric). */
const angleHz = (z: Complex, sampleRateHz: number) => (Math.abs(Math.atan2(z[1], z[0])) * sampleRateHz) / (2 * Math.PI);

/**
 * The frequencies in Hz at which to plot a design's response: n points log-spaced over `range` (default
 * (fs/2)·10^−4 … (fs/2)·(1 − 10^−3), as freqGrid 'log'), plus, for every zero and pole within
 * RESPONSE_GRID_LIMITS.nearCircle of the unit circle whose angle lies in the range, its angle itself and
 * points on each side at halvings of the local spacing and at multiples of the root's width |1 − r|.
 * Near such a root |H| changes over an interval of about |1 − r| rad and reaches its extreme at the
 * root's angle (Oppenheim & Schafer, Discrete-Time Signal Processing, 3rd ed., §5.3), which an even grid
 * steps over: a notch would be drawn tens of dB too shallow. Sorted ascending, duplicates removed.
 */
export function responseGrid(design: FilterDesign, n: number, range?: readonly [number, number]): number[] {
  const fs = design.sampleRateHz;
  if (!Number.isFinite(fs) || fs <= 0) throw new Error(`the sample rate must be a finite number > 0 Hz (got ${fs})`);
  if (!Number.isInteger(n) || n < 2) throw new Error(`the number of points must be an integer ≥ 2 (got ${n})`);
  const nyquist = fs / 2;
  const [lo, hi] = range ?? [nyquist * 10 ** -LOG_GRID_DECADES, nyquist * LOG_GRID_TOP_FRACTION];
  if (!(lo > 0 && hi > lo && hi <= nyquist)) throw new Error(`the range must satisfy 0 < low < high ≤ ${nyquist} Hz, half the sample rate (got ${lo} … ${hi} Hz)`);
  const ratio = (hi / lo) ** (1 / (n - 1));
  const points = Array.from({ length: n }, (_, i) => (i === n - 1 ? hi : lo * ratio ** i));
  const roots = [...(design.zeros ?? []), ...design.poles]
    .map((z) => ({ z, gap: Math.abs(1 - Math.hypot(z[0], z[1])) }))
    .filter((r) => r.gap <= RESPONSE_GRID_LIMITS.nearCircle)
    .sort((a, b) => a.gap - b.gap)
    .slice(0, RESPONSE_GRID_LIMITS.maxRoots);
  for (const { z, gap } of roots) {
    const f0 = angleHz(z, fs);
    if (!(f0 >= lo && f0 <= hi)) continue;
    const spacing = f0 * (ratio - 1);
    const offsets = [
      ...Array.from({ length: RESPONSE_GRID_LIMITS.halvings + 1 }, (_, k) => spacing * 2 ** -k),
      ...RESPONSE_GRID_LIMITS.widths.map((w) => (w * gap * fs) / (2 * Math.PI)),
    ];
    points.push(f0);
    for (const d of offsets) for (const f of [f0 - d, f0 + d]) if (d > 0 && f >= lo && f <= hi) points.push(f);
  }
  points.sort((a, b) => a - b);
  return points.filter((f, i) => i === 0 || f !== points[i - 1]);
}
