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

/**
 * Welch PSD of recent samples with segments of the largest power of two ≤ min(MAX_SEGMENT, n/4)
 * (at least 8 averages, 50 % overlap), and its strongest peaks; null with fewer than 64 samples.
 */
export function liveSpectrum(samples: Float64Array, sampleRateHz: number, peakCount = 5): LiveSpectrum | null {
  if (samples.length < 64) return null;
  const segmentLength = 2 ** Math.floor(Math.log2(Math.min(MAX_SEGMENT, samples.length / 4)));
  const { freqsHz, psd } = welch(samples, sampleRateHz, { segmentLength });
  const peaks = peakCount > 0 ? findPeaks(freqsHz, psd, { count: peakCount, minProminenceDb: 10, minSpacingHz: (4 * sampleRateHz) / segmentLength }) : [];
  const psdDb = psd.map((p) => 10 * Math.log10(Math.max(p, 1e-30)));
  return { freqsHz, psdDb, peaks };
}


/** The level in dB of a spectrum on liveSpectrum's evenly spaced bins (0 … fs/2) at the bin nearest f Hz. */
export function levelAtDb(freqsHz: readonly number[], psdDb: readonly number[], f: number): number | null {
  if (freqsHz.length < 2) return null;
  const i = Math.round((f - freqsHz[0]) / (freqsHz[1] - freqsHz[0]));
  return i >= 0 && i < psdDb.length ? psdDb[i] : null;
}
