import { findPeaks, frequencyResponse, welch, type FilterDesign } from "@/lib/dsp";
import type { CandidateMetrics } from "@/lib/protocol";

/** Largest lag searched, in seconds and in samples (whichever is smaller). */
export const MAX_LAG_SECONDS = 0.1;
export const MAX_LAG_SAMPLES = 256;

/**
 * Lag of y behind x in samples: the k in [0, maxLag] maximising the cross-correlation
 * Σ (x[n−k] − x̄)(y[n] − ȳ) over the overlap, normalised by overlap length (direct time-domain
 * cross-correlation peak; Knapp & Carter 1976 describe the general estimator, used here unweighted).
 */
export function crossCorrelationLag(x: Float64Array, y: Float64Array, maxLag: number): number {
  const n = Math.min(x.length, y.length);
  let mx = 0;
  let my = 0;
  for (let i = 0; i < n; i++) {
    mx += x[i];
    my += y[i];
  }
  mx /= n;
  my /= n;
  let best = 0;
  let bestValue = -Infinity;
  for (let k = 0; k <= Math.min(maxLag, n - 2); k++) {
    let s = 0;
    for (let i = k; i < n; i++) s += (x[i - k] - mx) * (y[i] - my);
    s /= n - k;
    if (s > bestValue) {
      bestValue = s;
      best = k;
    }
  }
  return best;
}

function rms(x: Float64Array): number {
  let s = 0;
  for (let i = 0; i < x.length; i++) s += x[i] * x[i];
  return Math.sqrt(s / x.length);
}

/** PSD value at the bin nearest f (unit²/Hz). */
function psdAt(freqsHz: number[], psd: number[], f: number): number {
  const step = freqsHz[1] - freqsHz[0];
  return psd[Math.min(psd.length - 1, Math.max(0, Math.round(f / step)))];
}

/**
 * Live metrics of one candidate from equally long, time-aligned blocks of raw input and candidate
 * output (the last second, taken only once the filter has run long enough to settle):
 * - lagMs: cross-correlation lag of output behind raw;
 * - removedRms: RMS of raw delayed by that lag minus the output, in the channel's unit;
 * - noiseLineHz: strongest spectral peak of raw (Welch PSD, findPeaks);
 * - measuredAttenuationDb: 10·log10 of raw PSD over output PSD at that line;
 * - predictedAttenuationDb: −|H| in dB of the design at that line.
 */
export function candidateMetrics(raw: Float64Array, out: Float64Array, design: FilterDesign): CandidateMetrics {
  const fs = design.sampleRateHz;
  const maxLag = Math.min(MAX_LAG_SAMPLES, Math.round(MAX_LAG_SECONDS * fs));
  const lag = crossCorrelationLag(raw, out, maxLag);
  const removed = new Float64Array(raw.length - lag);
  for (let i = lag; i < raw.length; i++) removed[i - lag] = raw[i - lag] - out[i];
  const segmentLength = Math.min(raw.length, 1024);
  const rawPsd = welch(raw, fs, { segmentLength });
  const [line] = findPeaks(rawPsd.freqsHz, rawPsd.psd, { count: 1 });
  const base = { removedRms: rms(removed), lagMs: (lag * 1000) / fs };
  if (!line) return { ...base, noiseLineHz: null, measuredAttenuationDb: null, predictedAttenuationDb: null };
  const outPsd = welch(out, fs, { segmentLength });
  const ratio = psdAt(rawPsd.freqsHz, rawPsd.psd, line.freqHz) / psdAt(outPsd.freqsHz, outPsd.psd, line.freqHz);
  return {
    ...base,
    noiseLineHz: line.freqHz,
    measuredAttenuationDb: Number.isFinite(ratio) && ratio > 0 ? 10 * Math.log10(ratio) : null,
    predictedAttenuationDb: -frequencyResponse(design, [line.freqHz]).magnitudeDb[0],
  };
}
