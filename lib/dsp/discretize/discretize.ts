import { matchedDiscretize } from "./matched";
import { properRational, type AnalogTransferFunction } from "./rational";
import { substituteBilinearForm } from "./substitution";
import { zohDiscretize } from "./zoh";

export const discretizationMethods = [
  "forward-euler",
  "backward-euler",
  "tustin",
  "tustin-prewarp",
  "zoh",
  "matched",
] as const;

export type DiscretizationMethod = (typeof discretizationMethods)[number];

export interface DiscretizeOptions {
  /** Frequency in Hz at which 'tustin-prewarp' is exact; required for that method, refused otherwise. */
  prewarpHz?: number;
}

/**
 * Digital equivalent of the analog H(s) = num(s)/den(s) (descending powers of s, s in rad/s) at
 * sampleRateHz, T = 1/fs. Returns b and a of equal length n + 1 (n = order of den) holding the
 * coefficients of z⁰, z⁻¹, … z⁻ⁿ, with a[0] = 1. Methods (Franklin, Powell & Workman, Digital
 * Control of Dynamic Systems ch. 6):
 * - 'forward-euler': s = (z − 1)/T (scipy.signal.cont2discrete 'euler');
 * - 'backward-euler': s = (z − 1)/(T·z) ('backward_diff');
 * - 'tustin': s = (2/T)·(z − 1)/(z + 1) ('bilinear');
 * - 'tustin-prewarp': s = (ω₀/tan(ω₀T/2))·(z − 1)/(z + 1), ω₀ = 2π·prewarpHz, exact at prewarpHz (§6.3.1);
 * - 'zoh': step invariant ('zoh'), see zohDiscretize;
 * - 'matched': matched pole-zero, see matchedDiscretize (scipy has no equivalent).
 * Throws for an improper or non-finite H(s), a bad sample rate or a bad prewarp frequency.
 */
export function discretize(
  tf: AnalogTransferFunction,
  sampleRateHz: number,
  method: DiscretizationMethod,
  opts: DiscretizeOptions = {},
): { b: number[]; a: number[] } {
  if (!Number.isFinite(sampleRateHz) || sampleRateHz <= 0) {
    throw new Error(`sampleRateHz must be a finite number above 0 Hz (got ${sampleRateHz})`);
  }
  if (!discretizationMethods.includes(method)) {
    throw new Error(`method must be one of ${discretizationMethods.join(", ")} (got ${String(method)})`);
  }
  if (method !== "tustin-prewarp" && opts.prewarpHz !== undefined) {
    throw new Error("prewarpHz is only used by the 'tustin-prewarp' method");
  }
  const { num, den } = properRational(tf);
  const periodS = 1 / sampleRateHz;
  switch (method) {
    case "forward-euler":
      return substituteBilinearForm(num, den, periodS, 0);
    case "backward-euler":
      return substituteBilinearForm(num, den, periodS, 1);
    case "tustin":
      return substituteBilinearForm(num, den, periodS, 0.5);
    case "tustin-prewarp":
      return substituteBilinearForm(num, den, prewarpedPeriod(opts.prewarpHz, sampleRateHz), 0.5);
    case "zoh":
      return zohDiscretize(num, den, periodS);
    case "matched":
      return matchedDiscretize(num, den, periodS);
  }
}

/**
 * The period T' = (2/ω₀)·tan(ω₀T/2) in s that makes Tustin's 2/T' equal ω₀/tan(ω₀T/2), the
 * prewarped constant (Franklin, Powell & Workman, Digital Control of Dynamic Systems, 3rd ed., §6.3.1).
 */
function prewarpedPeriod(prewarpHz: number | undefined, sampleRateHz: number): number {
  const nyquist = sampleRateHz / 2;
  if (prewarpHz === undefined || !Number.isFinite(prewarpHz) || prewarpHz <= 0 || prewarpHz >= nyquist) {
    throw new Error(
      `prewarpHz must be above 0 and below the Nyquist frequency ${nyquist} Hz (got ${prewarpHz})`,
    );
  }
  const w0 = 2 * Math.PI * prewarpHz;
  return (2 / w0) * Math.tan(w0 / (2 * sampleRateHz));
}
