/** A complex number as [re, im]; used for zeros and poles (z-plane or s-plane). */
export type Complex = [number, number];

/**
 * A designed digital filter. A single design has exactly one of `sos` and `taps`; a chain's design
 * has `stages` instead (and neither of the two).
 * `sos` rows are [b0, b1, b2, a0, a1, a2] with a0 = 1 (scipy.signal convention);
 * `taps` is the impulse response of an FIR design.
 * zeros, poles and gain are those of the whole filter (for a chain, the product of its stages).
 */
export interface FilterDesign {
  sampleRateHz: number;
  sos?: number[][];
  taps?: number[];
  stages?: StageDesign[];
  zeros: Complex[];
  poles: Complex[];
  gain: number;
}

/** One running stage of a chain: a single design (sos or taps) and its index in the chain spec's stages. */
export interface StageDesign extends Omit<FilterDesign, "stages"> {
  stage: number;
}
