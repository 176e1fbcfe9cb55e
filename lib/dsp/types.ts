/** A complex number as [re, im]; used for zeros and poles (z-plane or s-plane). */
export type Complex = [number, number];

/**
 * A transfer function kept in direct form: H(z) = Σ b_k z⁻ᵏ / Σ a_k z⁻ᵏ with a[0] = 1 (scipy.signal
 * `lfilter` convention), run exactly as given.
 */
export interface DirectForm {
  b: number[];
  a: number[];
}

/**
 * A designed digital filter. A single design has exactly one of `sos`, `taps` and `ba`; a chain's
 * design has `stages` instead (and none of the three).
 * `sos` rows are [b0, b1, b2, a0, a1, a2] with a0 = 1 (scipy.signal convention);
 * `taps` is the impulse response of an FIR design;
 * `ba` is a transfer function kept in direct form (pasted b/a of order ≤ 8, combs).
 * zeros, poles and gain are those of the whole filter (for a chain, the product of its stages).
 * `zeros` is left out where it would need root finding of FIR taps (O(N²) per iteration for N taps,
 * seconds at 1023 taps): `designZeros(design)` gives the zeros of any design, finding them then.
 */
export interface FilterDesign {
  sampleRateHz: number;
  sos?: number[][];
  taps?: number[];
  ba?: DirectForm;
  stages?: StageDesign[];
  zeros?: Complex[];
  poles: Complex[];
  gain: number;
}

/** One running stage of a chain: a single design (sos, taps or ba) and its index in the chain spec's stages. */
export interface StageDesign extends Omit<FilterDesign, "stages"> {
  stage: number;
}
