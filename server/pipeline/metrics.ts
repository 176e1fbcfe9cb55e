import FFT from "fft.js";
import { attenuationDb, findPeaks, peakGainDb, welch, type FilterDesign, type SpectralPeak, type WelchResult } from "@/lib/dsp";
import type { CandidateMetrics } from "@/lib/protocol";

/** Each live design's passband reference, found once: it is fixed for the design's life, and the search is the costly part of the prediction. */
const passbandReference = new WeakMap<FilterDesign, number>();

function referenceOf(design: FilterDesign): number {
  let reference = passbandReference.get(design);
  if (reference === undefined) passbandReference.set(design, (reference = peakGainDb(design)));
  return reference;
}

/** Largest lag searched, in seconds and in samples (whichever is smaller). */
export const MAX_LAG_SECONDS = 0.1;
export const MAX_LAG_SAMPLES = 256;

const ffts = new Map<number, FFT>();

function fftOf(size: number): FFT {
  let fft = ffts.get(size);
  if (!fft) ffts.set(size, (fft = new FFT(size)));
  return fft;
}

/**
 * Lag of y behind x in samples: the k in [0, maxLag] maximising the cross-correlation
 * Σ (x[n−k] − x̄)(y[n] − ȳ) divided by the overlap length n − k (unweighted cross-correlation peak;
 * Knapp & Carter 1976 describe the general estimator). All lags come from one zero-padded FFT
 * product, IFFT(conj(X)·Y), by the correlation theorem (Oppenheim & Schafer, Discrete-Time Signal Processing, 3rd ed.).
 */
export function crossCorrelationLag(x: Float64Array, y: Float64Array, maxLag: number): number {
  const n = Math.min(x.length, y.length);
  let size = 2;
  while (size < 2 * n) size *= 2;
  const fft = fftOf(size);
  const mean = (v: Float64Array) => v.subarray(0, n).reduce((a, b) => a + b, 0) / n;
  const mx = mean(x);
  const my = mean(y);
  const a = new Array<number>(2 * size).fill(0);
  const b = new Array<number>(2 * size).fill(0);
  for (let i = 0; i < n; i++) {
    a[2 * i] = x[i] - mx;
    b[2 * i] = y[i] - my;
  }
  const fa = fft.createComplexArray();
  const fb = fft.createComplexArray();
  fft.transform(fa, a);
  fft.transform(fb, b);
  for (let k = 0; k < size; k++) {
    const [ar, ai, br, bi] = [fa[2 * k], fa[2 * k + 1], fb[2 * k], fb[2 * k + 1]];
    a[2 * k] = ar * br + ai * bi;
    a[2 * k + 1] = ar * bi - ai * br;
  }
  const r = fft.createComplexArray();
  fft.inverseTransform(r, a);
  let best = 0;
  let bestValue = -Infinity;
  for (let k = 0; k <= Math.min(maxLag, n - 2); k++) {
    const v = r[2 * k] / (n - k);
    if (v > bestValue) {
      bestValue = v;
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

/** Samples per Welch segment for the metrics (fs/segment = bin spacing in Hz). */
const segmentFor = (n: number) => Math.min(n, 1024);

/** Raw spectrum and its strongest line, computed once per channel and shared by its candidates. */
export interface RawSpectrum {
  psd: WelchResult;
  line: SpectralPeak | undefined;
}

export function rawSpectrum(raw: Float64Array, sampleRateHz: number): RawSpectrum {
  const psd = welch(raw, sampleRateHz, { segmentLength: segmentFor(raw.length) });
  return { psd, line: findPeaks(psd.freqsHz, psd.psd, { count: 1 })[0] };
}

/**
 * Live metrics of one candidate from equally long, time-aligned blocks of raw input and candidate
 * output (the last second, taken only once the filter has run long enough to settle):
 * - lagMs: cross-correlation lag of output behind raw;
 * - removedRms: RMS of raw delayed by that lag minus the output, in the channel's unit;
 * - noiseLineHz: `lineHz` when the engineer chose one (the bench sends the line it judges, so both
 *   judge the same frequency), else the strongest spectral peak of raw (Welch PSD, findPeaks);
 * - measuredAttenuationDb: 10·log10 of raw PSD over output PSD in the Welch bin nearest that line
 *   (bins fs/1024 wide, so a notch narrower than a bin measures shallower than predicted);
 * - predictedAttenuationDb: the design's attenuation at that line below its passband peak
 *   (attenuationDb, the figure the comparison table shows).
 */
export function candidateMetrics(raw: Float64Array, out: Float64Array, design: FilterDesign, spectrum: RawSpectrum, lineHz: number | null = null): CandidateMetrics {
  const fs = design.sampleRateHz;
  const maxLag = Math.min(MAX_LAG_SAMPLES, Math.round(MAX_LAG_SECONDS * fs));
  const lag = crossCorrelationLag(raw, out, maxLag);
  const removed = new Float64Array(raw.length - lag);
  for (let i = lag; i < raw.length; i++) removed[i - lag] = raw[i - lag] - out[i];
  const base = { removedRms: rms(removed), lagMs: (lag * 1000) / fs };
  const line = lineHz !== null && lineHz > 0 && lineHz < fs / 2 ? lineHz : spectrum.line?.freqHz;
  if (line === undefined) return { ...base, noiseLineHz: null, measuredAttenuationDb: null, predictedAttenuationDb: null };
  const outPsd = welch(out, fs, { segmentLength: segmentFor(out.length) });
  const ratio = psdAt(spectrum.psd.freqsHz, spectrum.psd.psd, line) / psdAt(outPsd.freqsHz, outPsd.psd, line);
  return {
    ...base,
    noiseLineHz: line,
    measuredAttenuationDb: Number.isFinite(ratio) && ratio > 0 ? 10 * Math.log10(ratio) : null,
    predictedAttenuationDb: attenuationDb(design, [line], referenceOf(design))[0],
  };
}
