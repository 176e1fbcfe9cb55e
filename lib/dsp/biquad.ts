/** Biquad shapes from the Audio EQ Cookbook. */
export const biquadShapes = [
  "lowpass",
  "highpass",
  "bandpass",
  "notch",
  "peaking",
  "lowshelf",
  "highshelf",
] as const;

export type BiquadShape = (typeof biquadShapes)[number];

/** Shapes whose gain in dB is a design parameter. */
export const gainShapes: readonly BiquadShape[] = ["peaking", "lowshelf", "highshelf"];

export interface BiquadParams {
  shape: BiquadShape;
  /** f0 in Hz, 0 < f0 < fs/2: corner (lowpass, highpass), centre (bandpass, notch, peaking), shelf midpoint. */
  centerHz: number;
  /** Q > 0 (unitless); for the shelves the cookbook's Q form, Q = 1/√2 being the slope S = 1. */
  q: number;
  /** Gain in dB, used by peaking and the shelves only. */
  gainDb?: number;
  sampleRateHz: number;
}

/**
 * One second-order section [b0, b1, b2, 1, a1, a2] by the Audio EQ Cookbook formulas
 * (R. Bristow-Johnson, W3C Working Group Note 2021), normalised to a0 = 1:
 * w0 = 2π·f0/fs, α = sin(w0)/(2Q), A = 10^(gainDb/40). The bandpass is the constant 0 dB peak
 * gain variant; the shelves use the α-from-Q form (2·√A·α terms).
 */
export function rbjBiquad(p: BiquadParams): number[] {
  const nyquist = p.sampleRateHz / 2;
  if (!(p.centerHz > 0 && p.centerHz < nyquist)) {
    throw new Error(`centerHz must be above 0 and below the Nyquist frequency ${nyquist} Hz (got ${p.centerHz})`);
  }
  if (!(p.q > 0 && Number.isFinite(p.q))) throw new Error(`q must be a finite number above 0 (got ${p.q})`);
  const usesGain = gainShapes.includes(p.shape);
  if (usesGain && (p.gainDb === undefined || !Number.isFinite(p.gainDb))) {
    throw new Error(`gainDb (a finite number of dB) is required for a ${p.shape} biquad`);
  }
  const w0 = (2 * Math.PI * p.centerHz) / p.sampleRateHz;
  const cw = Math.cos(w0);
  const alpha = Math.sin(w0) / (2 * p.q);
  const A = usesGain ? 10 ** ((p.gainDb ?? 0) / 40) : 1;
  const twoSqrtAAlpha = 2 * Math.sqrt(A) * alpha;
  const [b, a] = ((): [number[], number[]] => {
    const allPole = [1 + alpha, -2 * cw, 1 - alpha];
    switch (p.shape) {
      case "lowpass":
        return [[(1 - cw) / 2, 1 - cw, (1 - cw) / 2], allPole];
      case "highpass":
        return [[(1 + cw) / 2, -(1 + cw), (1 + cw) / 2], allPole];
      case "bandpass":
        return [[alpha, 0, -alpha], allPole];
      case "notch":
        return [[1, -2 * cw, 1], allPole];
      case "peaking":
        return [
          [1 + alpha * A, -2 * cw, 1 - alpha * A],
          [1 + alpha / A, -2 * cw, 1 - alpha / A],
        ];
      case "lowshelf":
        return [
          [
            A * (A + 1 - (A - 1) * cw + twoSqrtAAlpha),
            2 * A * (A - 1 - (A + 1) * cw),
            A * (A + 1 - (A - 1) * cw - twoSqrtAAlpha),
          ],
          [A + 1 + (A - 1) * cw + twoSqrtAAlpha, -2 * (A - 1 + (A + 1) * cw), A + 1 + (A - 1) * cw - twoSqrtAAlpha],
        ];
      case "highshelf":
        return [
          [
            A * (A + 1 + (A - 1) * cw + twoSqrtAAlpha),
            -2 * A * (A - 1 + (A + 1) * cw),
            A * (A + 1 + (A - 1) * cw - twoSqrtAAlpha),
          ],
          [A + 1 - (A - 1) * cw + twoSqrtAAlpha, 2 * (A - 1 - (A + 1) * cw), A + 1 - (A - 1) * cw - twoSqrtAAlpha],
        ];
    }
  })();
  return [...b.map((c) => c / a[0]), 1, a[1] / a[0], a[2] / a[0]];
}
