import { peakGainDb } from "../analysis/gain";

/**
 * Redistribute a cascade's gain with L∞ scaling (Jackson, Digital Filters and Signal Processing,
 * cascade scaling — from memory): section k's numerator is scaled so the peak magnitude of
 * sections 1…k together, over [0, fs/2], is 1; the last section takes what is left, so the
 * overall response is unchanged. This keeps every intermediate output within full scale for
 * sinusoids, instead of leaving all the gain in section 1 (scipy.signal zpk2sos puts it there).
 * Rows are [b0, b1, b2, 1, a1, a2]; sampleRateHz only sets the frequency grid (Hz).
 */
export function spreadGain(sos: number[][], sampleRateHz: number): number[][] {
  const out: number[][] = [];
  let previousPeak = 1;
  sos.forEach((row, k) => {
    const partial = { sampleRateHz, sos: sos.slice(0, k + 1), zeros: [], poles: [], gain: 1 };
    const peak = k === sos.length - 1 ? 1 : 10 ** (peakGainDb(partial) / 20);
    if (!(peak > 0) || !Number.isFinite(peak)) {
      throw new Error(`cannot scale section ${k}: the peak gain of sections 0…${k} is ${peak}, must be finite and > 0`);
    }
    const factor = k === sos.length - 1 ? previousPeak : previousPeak / peak;
    out.push([row[0] * factor, row[1] * factor, row[2] * factor, row[3], row[4], row[5]]);
    previousPeak = peak;
  });
  return out;
}
