import { firWindow, zeroEndedWindows, type FirWindow } from "./windows";

export const firResponses = ["lowpass", "highpass", "bandpass", "bandstop"] as const;

export type FirResponse = (typeof firResponses)[number];

export interface WindowedSincParams {
  response: FirResponse;
  window: FirWindow;
  /** Number of taps N ≥ 1; must be odd for highpass and bandstop. */
  taps: number;
  /** Cutoff in Hz (lowpass, highpass) or band edges [low, high] in Hz (bandpass, bandstop). */
  cutoffHz: number | [number, number];
  sampleRateHz: number;
  /** Kaiser β (unitless), required when window is 'kaiser'. */
  kaiserBeta?: number;
}

/**
 * Windowed-sinc linear-phase FIR taps (scipy.signal.firwin convention, scale=True): the ideal
 * band response Σ (f₂·sinc(f₂·m) − f₁·sinc(f₁·m)) over the pass bands (edges normalised to Nyquist,
 * m = n − (N−1)/2) times the symmetric window, then scaled to unit gain at DC (lowpass, bandstop),
 * at Nyquist (highpass) or at the pass-band centre (bandpass). Oppenheim & Schafer, Discrete-Time Signal Processing, 3rd ed., §7.5.
 * Throws for an even N with highpass or bandstop (nonzero gain at Nyquist needs odd N), for N = 2
 * with a window that is 0 at both ends, and for cutoffs outside (0, fs/2).
 */
export function windowedSinc(p: WindowedSincParams): number[] {
  const nyquist = p.sampleRateHz / 2;
  const edges = typeof p.cutoffHz === "number" ? [p.cutoffHz] : [...p.cutoffHz];
  const wantsBand = p.response === "bandpass" || p.response === "bandstop";
  if (edges.length !== (wantsBand ? 2 : 1)) {
    throw new Error(`a ${p.response} FIR needs ${wantsBand ? "two band edges [low, high]" : "one cutoff"} in Hz`);
  }
  edges.forEach((f, i) => {
    if (!(f > 0 && f < nyquist) || (i > 0 && !(f > edges[i - 1]))) {
      throw new Error(`cutoffHz must be increasing and lie above 0 and below the Nyquist frequency ${nyquist} Hz`);
    }
  });
  if (zeroEndedWindows.includes(p.window) && p.taps === 2) {
    throw new Error(`the ${p.window} window is 0 at both ends, so it cannot have 2 taps (use 1 or at least 3)`);
  }
  const passNyquist = p.response === "highpass" || p.response === "bandstop";
  if (passNyquist && p.taps % 2 === 0) {
    throw new Error(
      `a ${p.response} FIR needs an odd number of taps: an even-length linear-phase FIR has zero gain ` +
        `at Nyquist (got ${p.taps})`,
    );
  }
  const passZero = p.response === "lowpass" || p.response === "bandstop";
  const normalised = [...(passZero ? [0] : []), ...edges.map((f) => f / nyquist), ...(passNyquist ? [1] : [])];
  const bands: Array<[number, number]> = [];
  for (let i = 0; i < normalised.length; i += 2) bands.push([normalised[i], normalised[i + 1]]);

  const centre = (p.taps - 1) / 2;
  const window = firWindow(p.window, p.taps, p.kaiserBeta);
  const h = window.map((w, n) => {
    const m = n - centre;
    return w * bands.reduce((acc, [lo, hi]) => acc + hi * sinc(hi * m) - lo * sinc(lo * m), 0);
  });

  const [firstLo, firstHi] = bands[0];
  const scaleFrequency = firstLo === 0 ? 0 : firstHi === 1 ? 1 : (firstLo + firstHi) / 2;
  const gain = h.reduce((acc, hn, n) => acc + hn * Math.cos(Math.PI * (n - centre) * scaleFrequency), 0);
  if (!(Math.abs(gain) > 0)) {
    throw new Error(`the windowed response has zero gain where it is scaled; use more taps (got ${p.taps})`);
  }
  return h.map((hn) => hn / gain);
}

/** Normalised sinc, sin(πx)/(πx), with sinc(0) = 1. */
function sinc(x: number): number {
  if (x === 0) return 1;
  const px = Math.PI * x;
  return Math.sin(px) / px;
}
