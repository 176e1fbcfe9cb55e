import { powerToDb } from "./units";

export interface PeakOptions {
  /** Most peaks returned, an integer ≥ 1; default 5. */
  count?: number;
  /** Least topographic prominence in dB, ≥ 0; default 6 dB. */
  minProminenceDb?: number;
  /** Least distance in Hz between returned peaks (a stronger peak wins), ≥ 0; default 0. */
  minSpacingHz?: number;
}

export interface SpectralPeak {
  /** Peak frequency in Hz, parabolically interpolated between bins. */
  freqHz: number;
  /** Interpolated peak height in the unit of psd (e.g. unit²/Hz). */
  psd: number;
  /** Topographic prominence in dB: height above the higher of the two lowest points reached before a higher bin. */
  prominenceDb: number;
}

/**
 * Strongest local maxima of a spectrum on an evenly spaced frequency grid (e.g. welch output),
 * strongest first. A DC bin (freqsHz[0] = 0) is left out, and so are the end bins, which have no
 * neighbour on one side. Each peak is refined by fitting a parabola to the three dB values around
 * it (quadratic interpolation: Smith, Spectral Audio Signal Processing — from memory). Prominence
 * follows scipy.signal.peak_prominences, computed on the dB values.
 */
export function findPeaks(freqsHz: readonly number[], psd: readonly number[], opts: PeakOptions = {}): SpectralPeak[] {
  const count = opts.count ?? 5;
  const minProminenceDb = opts.minProminenceDb ?? 6;
  const minSpacingHz = opts.minSpacingHz ?? 0;
  if (freqsHz.length !== psd.length) throw new Error("freqsHz and psd must have the same length");
  if (!Number.isInteger(count) || count < 1) throw new Error(`count must be an integer ≥ 1 (got ${count})`);
  if (!(minProminenceDb >= 0)) throw new Error(`minProminenceDb must be ≥ 0 dB (got ${minProminenceDb})`);
  if (!(minSpacingHz >= 0)) throw new Error(`minSpacingHz must be ≥ 0 Hz (got ${minSpacingHz})`);

  const first = freqsHz[0] === 0 ? 1 : 0;
  const f = freqsHz.slice(first);
  const db = psd.slice(first).map(powerToDb);
  const candidates: SpectralPeak[] = [];
  for (let i = 1; i + 1 < db.length; i++) {
    if (!(db[i] > db[i - 1] && db[i] >= db[i + 1])) continue;
    const prominenceDb = prominence(db, i);
    if (prominenceDb < minProminenceDb) continue;
    const [alpha, beta, gamma] = [db[i - 1], db[i], db[i + 1]];
    const p = (0.5 * (alpha - gamma)) / (alpha - 2 * beta + gamma);
    const peakDb = beta - 0.25 * (alpha - gamma) * p;
    candidates.push({ freqHz: f[i] + (p * (f[i + 1] - f[i - 1])) / 2, psd: 10 ** (peakDb / 10), prominenceDb });
  }
  candidates.sort((a, b) => b.psd - a.psd);
  const chosen: SpectralPeak[] = [];
  for (const c of candidates) {
    if (chosen.length === count) break;
    if (chosen.every((k) => Math.abs(k.freqHz - c.freqHz) >= minSpacingHz)) chosen.push(c);
  }
  return chosen;
}

/** Height of db[i] above the higher of the minima on each side, each taken up to the first higher value. */
function prominence(db: readonly number[], i: number): number {
  let leftMin = db[i];
  for (let j = i - 1; j >= 0 && db[j] <= db[i]; j--) leftMin = Math.min(leftMin, db[j]);
  let rightMin = db[i];
  for (let j = i + 1; j < db.length && db[j] <= db[i]; j++) rightMin = Math.min(rightMin, db[j]);
  return db[i] - Math.max(leftMin, rightMin);
}
