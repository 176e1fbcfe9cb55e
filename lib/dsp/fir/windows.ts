/** Window shapes for windowed-sinc FIR design. */
export const firWindows = ["rectangular", "hann", "hamming", "blackman", "kaiser"] as const;

export type FirWindow = (typeof firWindows)[number];

/** Windows whose end points are 0 (blackman up to rounding): with N = 2 nothing of the sinc is left. */
export const zeroEndedWindows: readonly FirWindow[] = ["hann", "blackman"];

/**
 * Symmetric N-point window w[0..N−1] (scipy.signal.get_window(..., fftbins=False) convention;
 * Harris 1978, Proc. IEEE 66(1)): with x = 2πn/(N−1),
 * rectangular 1; hann 0.5 − 0.5·cos x; hamming 0.54 − 0.46·cos x;
 * blackman 0.42 − 0.5·cos x + 0.08·cos 2x; kaiser I₀(β·√(1 − (2n/(N−1) − 1)²))/I₀(β)
 * (Kaiser & Schafer 1980, IEEE TASSP 28(1)). N = 1 gives [1]. β is unitless, 0 ≤ β.
 */
export function firWindow(kind: FirWindow, length: number, kaiserBeta?: number): number[] {
  if (!Number.isInteger(length) || length < 1) {
    throw new Error(`window length must be an integer of at least 1 (got ${length})`);
  }
  if (length === 1) return [1];
  const cosine = (coeffs: number[]) =>
    Array.from({ length }, (_, n) => {
      const x = (2 * Math.PI * n) / (length - 1);
      return coeffs.reduce((acc, c, k) => acc + (k % 2 === 0 ? c : -c) * Math.cos(k * x), 0);
    });
  switch (kind) {
    case "rectangular":
      return new Array<number>(length).fill(1);
    case "hann":
      return cosine([0.5, 0.5]);
    case "hamming":
      return cosine([0.54, 0.46]);
    case "blackman":
      return cosine([0.42, 0.5, 0.08]);
    case "kaiser": {
      if (kaiserBeta === undefined || !Number.isFinite(kaiserBeta) || kaiserBeta < 0) {
        throw new Error(`the kaiser window needs a finite kaiserBeta of at least 0 (got ${kaiserBeta})`);
      }
      const norm = besselI0(kaiserBeta);
      return Array.from({ length }, (_, n) => {
        const r = (2 * n) / (length - 1) - 1;
        return besselI0(kaiserBeta * Math.sqrt(Math.max(0, 1 - r * r))) / norm;
      });
    }
  }
}

/**
 * Kaiser window β for a stopband attenuation A in dB (Kaiser's empirical formula, Kaiser & Schafer
 * 1980; Oppenheim & Schafer, Discrete-Time Signal Processing, 3rd ed., §7.5.3 — from memory; scipy.signal.kaiser_beta): 0.1102·(A − 8.7) for A > 50,
 * 0.5842·(A − 21)^0.4 + 0.07886·(A − 21) for 21 < A ≤ 50, else 0.
 */
export function kaiserBeta(attenuationDb: number): number {
  if (!Number.isFinite(attenuationDb)) {
    throw new Error(`attenuationDb must be a finite number of dB (got ${attenuationDb})`);
  }
  if (attenuationDb > 50) return 0.1102 * (attenuationDb - 8.7);
  if (attenuationDb > 21) return 0.5842 * (attenuationDb - 21) ** 0.4 + 0.07886 * (attenuationDb - 21);
  return 0;
}

/**
 * Modified Bessel function of the first kind, order 0, by its power series Σ ((x/2)^k / k!)²
 * (Abramowitz & Stegun 9.6.12); all terms are positive, so summing to convergence is accurate.
 */
export function besselI0(x: number): number {
  const q = (x * x) / 4;
  let term = 1;
  let sum = 1;
  for (let k = 1; term > Number.EPSILON * sum; k++) {
    term *= q / (k * k);
    sum += term;
  }
  return sum;
}
