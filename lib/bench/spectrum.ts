import { findPeaks, welch, type SpectralPeak } from "@/lib/dsp";

export interface LiveSpectrum {
  freqsHz: number[];
  /** PSD in dB re 1 unit²/Hz. */
  psdDb: number[];
  /** Strongest peaks first. */
  peaks: SpectralPeak[];
}

/** Longest Welch segment (about fs/2048 Hz resolution), a power of two. */
export const MAX_SEGMENT = 2048;

/** Most recent samples a peak's frequency is refined on (bounds the work on long recordings). */
export const REFINE_SAMPLES = 16384;

/**
 * Welch PSD of recent samples with segments of the largest power of two ≤ min(MAX_SEGMENT, n/4)
 * (at least 8 averages, 50 % overlap), and its strongest peaks, each frequency refined on the whole
 * record (refinePeakHz), so a notch seeded from a peak lands on the line; null with fewer than 64 samples.
 */
export function liveSpectrum(samples: Float64Array, sampleRateHz: number, peakCount = 5): LiveSpectrum | null {
  if (samples.length < 64) return null;
  const segmentLength = 2 ** Math.floor(Math.log2(Math.min(MAX_SEGMENT, samples.length / 4)));
  const { freqsHz, psd } = welch(samples, sampleRateHz, { segmentLength });
  const binHz = sampleRateHz / segmentLength;
  const record = samples.subarray(Math.max(0, samples.length - REFINE_SAMPLES));
  const peaks = (peakCount > 0 ? findPeaks(freqsHz, psd, { count: peakCount, minProminenceDb: 10, minSpacingHz: 4 * binHz }) : []).map((p) => ({
    ...p,
    freqHz: refinePeakHz(record, sampleRateHz, p.freqHz, binHz),
  }));
  const psdDb = psd.map((p) => 10 * Math.log10(Math.max(p, 1e-30)));
  return { freqsHz, psdDb, peaks };
}


/** The level in dB of a spectrum on liveSpectrum's evenly spaced bins (0 … fs/2) at the bin nearest f Hz. */
export function levelAtDb(freqsHz: readonly number[], psdDb: readonly number[], f: number): number | null {
  if (freqsHz.length < 2) return null;
  const i = Math.round((f - freqsHz[0]) / (freqsHz[1] - freqsHz[0]));
  return i >= 0 && i < psdDb.length ? psdDb[i] : null;
}

/** The record without its mean, times a Hann window (Harris 1978): what refinePeakHz transforms. */
function hannWindowed(x: Float64Array): Float64Array {
  const n = x.length;
  const mean = x.reduce((sum, v) => sum + v, 0) / n;
  return x.map((v, i) => (v - mean) * (0.5 - 0.5 * Math.cos((2 * Math.PI * i) / (n - 1))));
}

/** |Σ v[n]·e^{−j2πfn/fs}|²: one DTFT sample of a windowed record, the phasor advanced by rotation. */
function dtftPower(v: Float64Array, fs: number, fHz: number): number {
  const w = (2 * Math.PI * fHz) / fs;
  const [cw, sw] = [Math.cos(w), Math.sin(w)];
  let [re, im, c, s] = [0, 0, 1, 0];
  for (let i = 0; i < v.length; i++) {
    re += v[i] * c;
    im -= v[i] * s;
    [c, s] = [c * cw - s * sw, s * cw + c * sw];
  }
  return re * re + im * im;
}

/** Golden-section steps after the grid: they shrink the two-bin bracket by 0.618^20 ≈ 7e-5. */
const GOLDEN_STEPS = 20;
const GOLDEN = (Math.sqrt(5) - 1) / 2;

/**
 * A spectral line's frequency in Hz refined on the whole record: the largest value of its Hann-windowed
 * DTFT within ±spanHz of a coarse estimate (a Welch bin), found on a grid of the record's bin fs/N (the
 * Hann main lobe is 4 bins wide, so the grid's best point lies in it) and then by golden-section search
 * between that point's neighbours, where the lobe has one maximum. The periodogram maximum is
 * the maximum-likelihood frequency of one sinusoid in white noise (Rife & Boorstyn, "Single-tone
 * parameter estimation from discrete-time observations", IEEE Trans. Inf. Theory 20(5), 1974). Returns
 * the estimate unchanged when the record is shorter than 64 samples or holds a non-finite sample.
 */
export function refinePeakHz(x: Float64Array, fs: number, approxHz: number, spanHz: number): number {
  const n = x.length;
  if (n < 64 || !x.every(Number.isFinite)) return approxHz;
  const v = hannWindowed(x);
  const power = (f: number) => dtftPower(v, fs, f);
  const step = fs / n;
  const lo = Math.max(step, approxHz - spanHz);
  const hi = Math.min(fs / 2 - step, approxHz + spanHz);
  if (!(hi > lo)) return approxHz;
  let best = approxHz;
  let bestPower = -1;
  for (let f = lo; f <= hi; f += step) {
    const p = power(f);
    if (p > bestPower) [best, bestPower] = [f, p];
  }
  let [a, b] = [best - step, best + step];
  let [c, d] = [b - GOLDEN * (b - a), a + GOLDEN * (b - a)];
  let [pc, pd] = [power(c), power(d)];
  for (let k = 0; k < GOLDEN_STEPS; k++) {
    if (pc > pd) {
      [b, d, pd] = [d, c, pc];
      c = b - GOLDEN * (b - a);
      pc = power(c);
    } else {
      [a, c, pc] = [c, d, pd];
      d = a + GOLDEN * (b - a);
      pd = power(d);
    }
  }
  return (a + b) / 2;
}
