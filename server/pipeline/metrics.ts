import FFT from "fft.js";
import { attenuationDb, findPeaks, welch, welchAt, type LiveDesign, type SpectralPeak, type WelchResult } from "@/lib/dsp";
import type { CandidateMetrics } from "@/lib/protocol";

/** Largest lag searched, in seconds and in samples (whichever is smaller). */
export const MAX_LAG_SECONDS = 0.1;
export const MAX_LAG_SAMPLES = 256;

const ffts = new Map<number, FFT>();
/** Work arrays of the lag search per transform length, reused call after call (the event loop runs one search at a time). */
const scratches = new Map<number, { padded: Float64Array; spectrum: Float64Array; correlation: Float64Array }>();

function scratchOf(size: number) {
  let scratch = scratches.get(size);
  if (!scratch) {
    scratch = { padded: new Float64Array(size), spectrum: new Float64Array(2 * size), correlation: new Float64Array(2 * size) };
    scratches.set(size, scratch);
  }
  return scratch;
}

function fftOf(size: number): FFT {
  let fft = ffts.get(size);
  if (!fft) ffts.set(size, (fft = new FFT(size)));
  return fft;
}

/** One side of the lag search, transformed once: the raw block, shared by every candidate of its channel. */
export interface LagReference {
  /** Samples compared. */
  n: number;
  /** Transform length: a power of two ≥ 2n, so the circular correlation equals the linear one for every lag searched. */
  size: number;
  /** Full spectrum of the mean-removed, zero-padded block, interleaved [re, im, …]. */
  spectrum: Float64Array;
}

/** Spectrum of x[0 … n−1] with its mean removed, zero-padded to `size`, written into `spectrum` (2·size) through `padded` (size). */
function centredSpectrum(x: Float64Array, n: number, size: number, padded: Float64Array, spectrum: Float64Array): Float64Array {
  const fft = fftOf(size);
  let mean = 0;
  for (let i = 0; i < n; i++) mean += x[i];
  mean /= n;
  for (let i = 0; i < n; i++) padded[i] = x[i] - mean;
  padded.fill(0, n);
  fft.realTransform(spectrum, padded);
  fft.completeSpectrum(spectrum);
  return spectrum;
}

export function lagReference(x: Float64Array, n: number): LagReference {
  let size = 2;
  while (size < 2 * n) size *= 2;
  return { n, size, spectrum: centredSpectrum(x, n, size, scratchOf(size).padded, new Float64Array(2 * size)) };
}

/**
 * Lag of y behind the reference x in samples: the k in [0, maxLag] maximising the cross-correlation
 * Σ (x[n−k] − x̄)(y[n] − ȳ) divided by the overlap length n − k (unweighted cross-correlation peak;
 * Knapp & Carter 1976 describe the general estimator). All lags come from one zero-padded FFT
 * product, IFFT(conj(X)·Y), by the correlation theorem (Oppenheim & Schafer, Discrete-Time Signal Processing, 3rd ed.).
 */
export function lagBehind(ref: LagReference, y: Float64Array, maxLag: number): number {
  const { n, size, spectrum: fx } = ref;
  const fft = fftOf(size);
  const scratch = scratchOf(size);
  const fy = centredSpectrum(y, n, size, scratch.padded, scratch.spectrum);
  for (let k = 0; k < size; k++) {
    const [ar, ai, br, bi] = [fx[2 * k], fx[2 * k + 1], fy[2 * k], fy[2 * k + 1]];
    fy[2 * k] = ar * br + ai * bi;
    fy[2 * k + 1] = ar * bi - ai * br;
  }
  const r = scratch.correlation;
  fft.inverseTransform(r, fy);
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

/** lagBehind for a single pair of blocks (over their common length). */
export function crossCorrelationLag(x: Float64Array, y: Float64Array, maxLag: number): number {
  return lagBehind(lagReference(x, Math.min(x.length, y.length)), y, maxLag);
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

/** Raw spectrum, its strongest line and the lag search's transform of it, computed once per channel and shared by its candidates. */
export interface RawSpectrum {
  psd: WelchResult;
  line: SpectralPeak | undefined;
  lag: LagReference;
}

export function rawSpectrum(raw: Float64Array, sampleRateHz: number): RawSpectrum {
  const psd = welch(raw, sampleRateHz, { segmentLength: segmentFor(raw.length) });
  return { psd, line: findPeaks(psd.freqsHz, psd.psd, { count: 1 })[0], lag: lagReference(raw, raw.length) };
}

/**
 * Live metrics of one candidate from equally long, time-aligned blocks of raw input and candidate
 * output (the last second, taken only once the filter has run long enough to settle):
 * - lagMs: cross-correlation lag of output behind raw;
 * - removedRms: RMS of raw delayed by that lag minus the output, in the channel's unit;
 * - noiseLineHz: `lineHz` when the engineer chose one (the bench sends the line it judges, so both
 *   judge the same frequency), else the strongest spectral peak of raw (Welch PSD, findPeaks);
 * - measuredAttenuationDb: 10·log10 of raw PSD over output PSD in the Welch bin nearest that line
 *   (bins fs/1024 wide, so a notch narrower than a bin measures shallower than predicted; the
 *   output's PSD is computed in that bin only, welchAt);
 * - predictedAttenuationDb: the design's attenuation at that line below its passband peak
 *   (attenuationDb against the passband reference found with the design, the figure the comparison
 *   table shows).
 */
export function candidateMetrics(raw: Float64Array, out: Float64Array, live: LiveDesign, spectrum: RawSpectrum, lineHz: number | null = null): CandidateMetrics {
  const { design, passbandDb } = live;
  const fs = design.sampleRateHz;
  if (out.length !== raw.length || spectrum.lag.n !== raw.length) {
    throw new Error(`live metrics need equally long blocks (raw ${raw.length}, output ${out.length}, spectrum ${spectrum.lag.n} samples)`);
  }
  const maxLag = Math.min(MAX_LAG_SAMPLES, Math.round(MAX_LAG_SECONDS * fs));
  const lag = lagBehind(spectrum.lag, out, maxLag);
  const removed = new Float64Array(raw.length - lag);
  for (let i = lag; i < raw.length; i++) removed[i - lag] = raw[i - lag] - out[i];
  const base = { removedRms: rms(removed), lagMs: (lag * 1000) / fs };
  const line = lineHz !== null && lineHz > 0 && lineHz < fs / 2 ? lineHz : spectrum.line?.freqHz;
  if (line === undefined) return { ...base, noiseLineHz: null, measuredAttenuationDb: null, predictedAttenuationDb: null };
  const ratio = psdAt(spectrum.psd.freqsHz, spectrum.psd.psd, line) / welchAt(out, fs, line, { segmentLength: segmentFor(out.length) });
  return {
    ...base,
    noiseLineHz: line,
    measuredAttenuationDb: Number.isFinite(ratio) && ratio > 0 ? 10 * Math.log10(ratio) : null,
    predictedAttenuationDb: attenuationDb(design, [line], passbandDb)[0],
  };
}
