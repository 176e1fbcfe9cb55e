import { makeRealDft } from "./dft";

export interface WelchOptions {
  /** Samples per segment (nperseg), an integer ≥ 2 and ≤ x.length; default min(256, x.length). Any length works (see dft.ts). */
  segmentLength?: number;
  /** Samples shared by consecutive segments (noverlap), an integer in [0, segmentLength − 1]; default ⌊segmentLength/2⌋. */
  overlap?: number;
}

export interface WelchResult {
  /** Bin frequencies k·fs/segmentLength in Hz, k = 0 … ⌊segmentLength/2⌋. */
  freqsHz: number[];
  /** One-sided power spectral density in unit²/Hz (unit of x squared per Hz). */
  psd: number[];
}

/**
 * Welch's averaged periodogram (Welch 1967, IEEE Trans. AU-15), with scipy.signal.welch's defaults:
 * periodic Hann window, segments of `segmentLength` samples stepping by segmentLength − overlap (a
 * trailing part shorter than a segment is dropped), the mean removed from each segment ('constant'
 * detrend), density scaling 1/(fs·Σw²), mean over segments, one-sided (×2 except DC and, for an even
 * segment length, Nyquist). Throws for fewer than 2 samples, non-finite samples or out-of-range options.
 */
export function welch(x: Float64Array, sampleRateHz: number, opts: WelchOptions = {}): WelchResult {
  if (!Number.isFinite(sampleRateHz) || sampleRateHz <= 0) {
    throw new Error(`sampleRateHz must be a finite number > 0 Hz (got ${sampleRateHz})`);
  }
  if (x.length < 2) throw new Error(`welch needs at least 2 samples (got ${x.length})`);
  if (x.some((v) => !Number.isFinite(v))) throw new Error("welch needs finite samples (found NaN or ±Infinity)");
  const nperseg = opts.segmentLength ?? Math.min(256, x.length);
  if (!Number.isInteger(nperseg) || nperseg < 2 || nperseg > x.length) {
    throw new Error(`segmentLength must be an integer in [2, ${x.length}] samples (got ${nperseg})`);
  }
  const noverlap = opts.overlap ?? Math.floor(nperseg / 2);
  if (!Number.isInteger(noverlap) || noverlap < 0 || noverlap >= nperseg) {
    throw new Error(`overlap must be an integer in [0, ${nperseg - 1}] samples (got ${noverlap})`);
  }

  const window = periodicHann(nperseg);
  const scale = 1 / (sampleRateHz * window.reduce((s, w) => s + w * w, 0));
  const dft = makeRealDft(nperseg);
  const bins = Math.floor(nperseg / 2) + 1;
  const step = nperseg - noverlap;
  const segments = Math.floor((x.length - noverlap) / step);
  const sum = new Float64Array(bins);
  const segment = new Float64Array(nperseg);
  for (let s = 0; s < segments; s++) {
    const start = s * step;
    let mean = 0;
    for (let i = 0; i < nperseg; i++) mean += x[start + i];
    mean /= nperseg;
    for (let i = 0; i < nperseg; i++) segment[i] = (x[start + i] - mean) * window[i];
    const spectrum = dft(segment);
    for (let k = 0; k < bins; k++) sum[k] += spectrum[2 * k] ** 2 + spectrum[2 * k + 1] ** 2;
  }
  const lastDoubled = nperseg % 2 === 0 ? bins - 2 : bins - 1;
  const psd = Array.from(sum, (v, k) => ((k >= 1 && k <= lastDoubled ? 2 : 1) * v * scale) / segments);
  const freqsHz = Array.from({ length: bins }, (_, k) => (k * sampleRateHz) / nperseg);
  return { freqsHz, psd };
}

/** Periodic Hann window w[i] = 0.5 − 0.5·cos(2πi/n) (Harris 1978; scipy.signal.get_window('hann', n)). */
export function periodicHann(n: number): Float64Array {
  return Float64Array.from({ length: n }, (_, i) => 0.5 - 0.5 * Math.cos((2 * Math.PI * i) / n));
}
