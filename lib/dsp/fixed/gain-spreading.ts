import { peakGainDb } from "../analysis/gain";

/**
 * Redistribute a cascade's gain with L∞ scaling (Jackson, Digital Filters and Signal Processing,
 * cascade scaling — from memory): section k's numerator is scaled so the peak magnitude of
 * sections 0…k together, over [0, fs/2], is 1; the last section takes what is left, so the
 * overall response is unchanged. This keeps every intermediate output within full scale for
 * sinusoids, instead of leaving all the gain in section 0 (scipy.signal zpk2sos puts it there).
 * Rows are [b0, b1, b2, 1, a1, a2]; sampleRateHz only sets the frequency grid (Hz).
 */
export function spreadGain(sos: number[][], sampleRateHz: number): number[][] {
  if (sos.length === 0) throw new Error("sos must have at least 1 section (got 0)");
  const scale = (row: number[], f: number) => [row[0] * f, row[1] * f, row[2] * f, row[3], row[4], row[5]];
  const out: number[][] = [];
  let previousPeak = 1;
  sos.slice(0, -1).forEach((row, k) => {
    const peak = 10 ** (peakGainDb({ sampleRateHz, sos: sos.slice(0, k + 1), zeros: [], poles: [], gain: 1 }) / 20);
    if (!(peak > 0) || !Number.isFinite(peak)) {
      throw new Error(`cannot scale section ${k}: the peak gain of sections 0…${k} is ${peak}, must be finite and > 0`);
    }
    out.push(scale(row, previousPeak / peak));
    previousPeak = peak;
  });
  out.push(scale(sos[sos.length - 1], previousPeak));
  return out;
}
