/** Decades covered by the log grid: it starts at (fs/2)·10^−4. */
export const LOG_GRID_DECADES = 4;
/** The log grid ends at (fs/2)·(1 − 10^−3), just below Nyquist, where many responses are exactly 0 or π. */
export const LOG_GRID_TOP_FRACTION = 1 - 1e-3;

/**
 * Frequencies in Hz for plots: 'linear' is n points from 0 to fs/2 inclusive; 'log' is n points
 * evenly spaced in log f from (fs/2)·10^−4 to (fs/2)·(1 − 10^−3) (common practice).
 */
export function freqGrid(sampleRateHz: number, n: number, scale: "log" | "linear"): number[] {
  if (scale === "linear") return linearGrid(sampleRateHz, n);
  if (scale === "log") return logGrid(sampleRateHz, n);
  throw new Error(`scale must be 'log' or 'linear' (got ${String(scale)})`);
}

/** n points from 0 to fs/2 Hz inclusive. */
export function linearGrid(sampleRateHz: number, n: number): number[] {
  checkGrid(sampleRateHz, n);
  const nyquist = sampleRateHz / 2;
  return Array.from({ length: n }, (_, i) => (i === n - 1 ? nyquist : (nyquist * i) / (n - 1)));
}

/** n points log-spaced from (fs/2)·10^−LOG_GRID_DECADES to (fs/2)·LOG_GRID_TOP_FRACTION Hz. */
export function logGrid(sampleRateHz: number, n: number): number[] {
  checkGrid(sampleRateHz, n);
  const lo = Math.log10((sampleRateHz / 2) * 10 ** -LOG_GRID_DECADES);
  const hi = Math.log10((sampleRateHz / 2) * LOG_GRID_TOP_FRACTION);
  return Array.from({ length: n }, (_, i) => 10 ** (lo + ((hi - lo) * i) / (n - 1)));
}

function checkGrid(sampleRateHz: number, n: number): void {
  if (!Number.isFinite(sampleRateHz) || sampleRateHz <= 0) {
    throw new Error(`sampleRateHz must be a finite number > 0 Hz (got ${sampleRateHz})`);
  }
  if (!Number.isInteger(n) || n < 2) throw new Error(`n must be an integer ≥ 2 (got ${n})`);
}
