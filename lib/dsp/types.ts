/** A complex number as [re, im]; used for zeros and poles (z-plane or s-plane). */
export type Complex = [number, number];

/**
 * A designed digital filter. Exactly one of `sos` and `taps` is present.
 * `sos` rows are [b0, b1, b2, a0, a1, a2] with a0 = 1 (scipy.signal convention);
 * `taps` is the impulse response of an FIR design.
 */
export interface FilterDesign {
  sampleRateHz: number;
  sos?: number[][];
  taps?: number[];
  zeros: Complex[];
  poles: Complex[];
  gain: number;
}
