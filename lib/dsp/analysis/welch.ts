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

/** Segment length and overlap after the checks welch states. */
function welchShape(x: Float64Array, sampleRateHz: number, opts: WelchOptions): { nperseg: number; noverlap: number } {
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
  return { nperseg, noverlap };
}

interface SegmentPlan {
  window: Float64Array;
  /** Σ w² of the window. */
  windowPower: number;
  dft: (x: Float64Array) => Float64Array;
}

/** Plans by segment length, kept (at most PLANS_KEPT) because the live metrics ask for the same lengths every second. */
const plans = new Map<number, SegmentPlan>();
const PLANS_KEPT = 8;

function planFor(nperseg: number): SegmentPlan {
  let plan = plans.get(nperseg);
  if (!plan) {
    const window = periodicHann(nperseg);
    plan = { window, windowPower: window.reduce((s, w) => s + w * w, 0), dft: makeRealDft(nperseg) };
    const oldest = plans.keys().next();
    if (plans.size >= PLANS_KEPT && !oldest.done) plans.delete(oldest.value);
    plans.set(nperseg, plan);
  }
  return plan;
}

/** Calls visit with each windowed, mean-removed segment (one buffer, overwritten); returns the number of segments. */
function eachSegment(x: Float64Array, nperseg: number, noverlap: number, window: Float64Array, visit: (segment: Float64Array) => void): number {
  const step = nperseg - noverlap;
  const segments = Math.floor((x.length - noverlap) / step);
  const segment = new Float64Array(nperseg);
  for (let s = 0; s < segments; s++) {
    const start = s * step;
    let mean = 0;
    for (let i = 0; i < nperseg; i++) mean += x[start + i];
    mean /= nperseg;
    for (let i = 0; i < nperseg; i++) segment[i] = (x[start + i] - mean) * window[i];
    visit(segment);
  }
  return segments;
}

/** One-sided factor of bin k: 2, except DC and (for an even segment length) Nyquist. */
const oneSided = (k: number, nperseg: number) => (k === 0 || (nperseg % 2 === 0 && k === nperseg / 2) ? 1 : 2);

/**
 * Welch's averaged periodogram (Welch 1967, IEEE Trans. AU-15), with scipy.signal.welch's defaults:
 * periodic Hann window, segments of `segmentLength` samples stepping by segmentLength − overlap (a
 * trailing part shorter than a segment is dropped), the mean removed from each segment ('constant'
 * detrend), density scaling 1/(fs·Σw²), mean over segments, one-sided (×2 except DC and, for an even
 * segment length, Nyquist). Throws for fewer than 2 samples, non-finite samples or out-of-range options.
 */
export function welch(x: Float64Array, sampleRateHz: number, opts: WelchOptions = {}): WelchResult {
  const { nperseg, noverlap } = welchShape(x, sampleRateHz, opts);
  const { window, windowPower, dft } = planFor(nperseg);
  const scale = 1 / (sampleRateHz * windowPower);
  const bins = Math.floor(nperseg / 2) + 1;
  const sum = new Float64Array(bins);
  const segments = eachSegment(x, nperseg, noverlap, window, (segment) => {
    const spectrum = dft(segment);
    for (let k = 0; k < bins; k++) sum[k] += spectrum[2 * k] ** 2 + spectrum[2 * k + 1] ** 2;
  });
  const psd = Array.from(sum, (v, k) => (oneSided(k, nperseg) * v * scale) / segments);
  const freqsHz = Array.from({ length: bins }, (_, k) => (k * sampleRateHz) / nperseg);
  return { freqsHz, psd };
}

/**
 * welch's PSD in the one bin nearest freqHz (k = round(f·segmentLength/fs), clamped to the bins), the
 * same value welch gives there, from a single DFT term per segment, X[k] = Σ s[m]·e^{−j2πkm/n}, instead of
 * a whole transform: for a figure judged at one frequency.
 */
export function welchAt(x: Float64Array, sampleRateHz: number, freqHz: number, opts: WelchOptions = {}): number {
  const { nperseg, noverlap } = welchShape(x, sampleRateHz, opts);
  const { window, windowPower } = planFor(nperseg);
  const k = Math.min(Math.floor(nperseg / 2), Math.max(0, Math.round((freqHz * nperseg) / sampleRateHz)));
  const cos = new Float64Array(nperseg);
  const sin = new Float64Array(nperseg);
  for (let m = 0; m < nperseg; m++) {
    // km reduced mod n keeps the angle exact for long segments.
    const angle = (2 * Math.PI * ((k * m) % nperseg)) / nperseg;
    cos[m] = Math.cos(angle);
    sin[m] = Math.sin(angle);
  }
  let sum = 0;
  const segments = eachSegment(x, nperseg, noverlap, window, (segment) => {
    let re = 0;
    let im = 0;
    for (let m = 0; m < nperseg; m++) {
      re += segment[m] * cos[m];
      im -= segment[m] * sin[m];
    }
    sum += re * re + im * im;
  });
  return (oneSided(k, nperseg) * sum) / (sampleRateHz * windowPower) / segments;
}

/** Periodic Hann window w[i] = 0.5 − 0.5·cos(2πi/n) (Harris 1978; scipy.signal.get_window('hann', n)). */
export function periodicHann(n: number): Float64Array {
  return Float64Array.from({ length: n }, (_, i) => 0.5 - 0.5 * Math.cos((2 * Math.PI * i) / n));
}
