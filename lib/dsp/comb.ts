import { bandwidthBeta, type NotchShape } from "./notch";
import type { Complex, DirectForm } from "./types";

/** Largest relative mismatch |f0 − fs/N|/fs accepted for fs/f0 to count as the integer N (as scipy.signal.iircomb). */
export const COMB_DIVISIBILITY_TOLERANCE = 1e-14;

/** The comb's delay N = fs/f0 when it is an integer (to COMB_DIVISIBILITY_TOLERANCE), else null. */
export function combOrder(fundamentalHz: number, sampleRateHz: number): number | null {
  const n = Math.round(sampleRateHz / fundamentalHz);
  if (!(n >= 1) || Math.abs(fundamentalHz - sampleRateHz / n) / sampleRateHz > COMB_DIVISIBILITY_TOLERANCE) return null;
  return n;
}

/**
 * A notch or a peak at every harmonic k·f0 (k = 0, 1, …, so at DC too) with q = f0/(−3 dB bandwidth),
 * as scipy.signal.iircomb (notch: pass_zero=False; peak: pass_zero=True); S. J. Orfanidis, Introduction
 * to Signal Processing, Prentice Hall, 1996, eqs. 11.5.1 and 11.5.3: with N = fs/f0, Δω = 2π·f0/(fs·q)
 * and β = tan(N·Δω/4), a = (1 − β)/(1 + β),
 * notch H(z) = (1 − z⁻ᴺ)/(1 + β) / (1 − a·z⁻ᴺ); peak H(z) = β/(1 + β)·(1 + z⁻ᴺ) / (1 − a·z⁻ᴺ).
 * Zeros: the N-th roots of 1 (notch, on the harmonics) or of −1 (peak, halfway between); poles: the
 * N-th roots of a (radius a^(1/N), on the harmonics); gain b[0]. Needs fs/f0 an integer N ≥ 2 and q > 1.
 */
export function combDesign(
  shape: NotchShape,
  fundamentalHz: number,
  q: number,
  sampleRateHz: number,
): { ba: DirectForm; zeros: Complex[]; poles: Complex[]; gain: number } {
  const n = combOrder(fundamentalHz, sampleRateHz);
  if (n === null || n < 2) {
    throw new Error(`sampleRateHz/fundamentalHz must be an integer of at least 2 (got ${sampleRateHz / fundamentalHz})`);
  }
  if (!(q > 1)) throw new Error(`q must be above 1 (got ${q})`);
  const bandwidth = (2 * Math.PI * fundamentalHz) / sampleRateHz / q;
  const beta = bandwidthBeta((n * bandwidth) / 2);
  const pole = (1 - beta) / (1 + beta);
  const b0 = shape === "notch" ? 1 / (1 + beta) : beta / (1 + beta);
  const b = new Array<number>(n + 1).fill(0);
  const a = new Array<number>(n + 1).fill(0);
  b[0] = b0;
  b[n] = shape === "notch" ? -b0 : b0;
  a[0] = 1;
  a[n] = -pole;
  const radius = pole ** (1 / n);
  return {
    ba: { b, a },
    zeros: rootsOnCircle(n, shape === "notch" ? 0 : 1),
    poles: rootsOnCircle(n, 0).map(([re, im]): Complex => [radius * re, radius * im]),
    gain: b0,
  };
}

/**
 * e^{jπ(2k + offset)/n} for k = 0 … n − 1 (offset 0: the n-th roots of 1; offset 1: of −1), with each
 * conjugate pair exactly conjugate and the real roots exactly ±1.
 */
function rootsOnCircle(n: number, offset: 0 | 1): Complex[] {
  return Array.from({ length: n }, (_, k): Complex => {
    const twice = 2 * k + offset;
    if (twice === 0) return [1, 0];
    if (twice === n) return [-1, 0];
    const mirrored = twice > n;
    const angle = (Math.PI * (mirrored ? 2 * n - twice : twice)) / n;
    return [Math.cos(angle), mirrored ? -Math.sin(angle) : Math.sin(angle)];
  });
}
