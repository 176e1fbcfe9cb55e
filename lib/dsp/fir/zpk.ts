import { finiteRoots } from "../poly-finite";
import type { Complex } from "../types";

/**
 * Zeros, poles and gain of the FIR H(z) = Σ h[n]·z⁻ⁿ written in positive powers of z:
 * zeros are the roots of h[0]·z^{N−1} + … + h[N−1], the N − 1 poles sit at the origin and the gain
 * is the first nonzero tap (scipy.signal.tf2zpk convention for the numerator). Throws when every tap
 * is zero or a zero overflows the double range.
 */
export function firZpk(taps: number[]): { zeros: Complex[]; poles: Complex[]; gain: number } {
  const gain = taps.find((t) => t !== 0);
  if (gain === undefined) throw new Error("an FIR needs at least one nonzero tap");
  return {
    zeros: finiteRoots(taps, "taps"),
    poles: Array.from({ length: taps.length - 1 }, (): Complex => [0, 0]),
    gain,
  };
}
