import { firWindow, type FirWindow } from "./windows";

export interface ArbitraryFirParams {
  /** Number of taps N ≥ 1 (even N needs zero gain at Nyquist). */
  taps: number;
  /** Frequencies in Hz from 0 to fs/2, nondecreasing; a value may appear twice (a jump in gain). */
  freqsHz: number[];
  /** Gain at each frequency (dimensionless); linear in between. */
  gains: number[];
  window: FirWindow;
  /** Kaiser β (unitless), required when window is 'kaiser'. */
  kaiserBeta?: number;
  sampleRateHz: number;
}

/**
 * Linear-phase FIR with an arbitrary piecewise-linear magnitude, by frequency sampling and a window
 * (scipy.signal.firwin2 with its default nfreqs; Oppenheim & Schafer, Discrete-Time Signal Processing,
 * 3rd ed., §7.5 for the window method): the gains are interpolated linearly on
 * nfreqs = 1 + 2^⌈log2 N⌉ equally spaced frequencies from 0 to fs/2 (a repeated frequency is first
 * split by ±ε·fs/2 so the jump is kept), given the linear phase e^{−jπ(N−1)f/(fs/2)/2}, brought back to
 * time by an inverse real DFT of length 2·(nfreqs − 1), and the first N samples are multiplied by the
 * symmetric window. Throws for a frequency list that does not start at 0 and end at fs/2, is not
 * nondecreasing or repeats a value more than twice (or repeats 0 or fs/2), and for even N with a gain
 * at Nyquist.
 */
export function arbitraryFirTaps(p: ArbitraryFirParams): number[] {
  const { taps: n, gains, sampleRateHz: fs } = p;
  const nyquist = fs / 2;
  const freqs = p.freqsHz;
  if (!Number.isInteger(n) || n < 1) throw new Error(`taps must be an integer of at least 1 (got ${n})`);
  if (freqs.length !== gains.length || freqs.length < 2) throw new Error("freqsHz and gains need the same length, at least 2");
  if (freqs[0] !== 0 || freqs[freqs.length - 1] !== nyquist) throw new Error(`freqsHz must start at 0 and end at ${nyquist} Hz`);
  for (let k = 1; k < freqs.length; k++) {
    if (freqs[k] < freqs[k - 1]) throw new Error("freqsHz must be nondecreasing");
    if (k >= 2 && freqs[k] === freqs[k - 2]) throw new Error(`freqsHz repeats ${freqs[k]} Hz more than twice`);
  }
  if (freqs[1] === 0 || freqs[freqs.length - 2] === nyquist) throw new Error("0 and fs/2 may appear only once in freqsHz");
  if (n % 2 === 0 && gains[gains.length - 1] !== 0) {
    throw new Error("an even number of taps has zero gain at Nyquist: the last gain must be 0, or use an odd number of taps");
  }
  let power = 1;
  while (power < n) power *= 2;
  const points = power + 1;
  const split = splitRepeats(freqs, Number.EPSILON * nyquist);
  const step = nyquist / (points - 1);
  const real = new Float64Array(points);
  const imag = new Float64Array(points);
  for (let k = 0; k < points; k++) {
    const f = k === points - 1 ? nyquist : k * step;
    const gain = interpolate(split, gains, f);
    const phase = (((-(n - 1) / 2) * Math.PI) * f) / nyquist;
    real[k] = gain * Math.cos(phase);
    imag[k] = gain * Math.sin(phase);
  }
  const window = firWindow(p.window, n, p.kaiserBeta);
  return inverseRealDft(real, imag, n).map((h, i) => h * window[i]);
}

/** Repeated frequencies moved apart by ±eps (firwin2's tweak), which must leave the list strictly increasing. */
function splitRepeats(freqs: number[], eps: number): number[] {
  const out = [...freqs];
  for (let k = 0; k + 1 < out.length; k++) {
    if (out[k] === out[k + 1]) {
      out[k] -= eps;
      out[k + 1] += eps;
    }
  }
  for (let k = 1; k < out.length; k++) {
    if (!(out[k] > out[k - 1])) throw new Error(`freqsHz has values too close (within ${eps} Hz) to a repeated one`);
  }
  return out;
}

/** Piecewise-linear interpolation of (xs, ys) at x, xs increasing, xs[0] ≤ x ≤ xs[last] (numpy.interp). */
function interpolate(xs: number[], ys: number[], x: number): number {
  const last = xs.length - 1;
  if (x >= xs[last]) return ys[last];
  if (x <= xs[0]) return ys[0];
  let lo = 0;
  let hi = last;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (xs[mid] <= x) lo = mid;
    else hi = mid;
  }
  if (x === xs[lo]) return ys[lo];
  const slope = (ys[lo + 1] - ys[lo]) / (xs[lo + 1] - xs[lo]);
  return slope * (x - xs[lo]) + ys[lo];
}

/**
 * The first `count` samples of the inverse real DFT of length M = 2·(K − 1) from the K one-sided bins
 * (numpy.fft.irfft; the imaginary parts of bins 0 and K − 1 are ignored, as there):
 * h[n] = (X₀ + (−1)ⁿ·X_{K−1} + 2·Σ_{k=1}^{K−2} Re(X_k·e^{j2πkn/M}))/M, summed directly with a cosine table.
 */
function inverseRealDft(real: Float64Array, imag: Float64Array, count: number): number[] {
  const bins = real.length;
  const m = 2 * (bins - 1);
  const cos = Float64Array.from({ length: m }, (_, i) => Math.cos((2 * Math.PI * i) / m));
  const sin = Float64Array.from({ length: m }, (_, i) => Math.sin((2 * Math.PI * i) / m));
  return Array.from({ length: count }, (_, n) => {
    let sum = real[0] + (n % 2 === 0 ? real[bins - 1] : -real[bins - 1]);
    for (let k = 1, at = n % m; k < bins - 1; k++, at = (at + n) % m) sum += 2 * (real[k] * cos[at] - imag[k] * sin[at]);
    return sum / m;
  });
}
