import { accurateSum } from "./accurate-sum";

/**
 * Σb/Σa, the DC gain of a direct form (dimensionless), or null when Σa = 0 (a pole at z = 1). Both sums
 * are compensated (accurateSum), so the result is within a few ulps of the exact value of the given
 * coefficients even when Σa is orders of magnitude below Σ|a_k|.
 */
export function directFormDcGain(b: readonly number[], a: readonly number[]): number | null {
  const den = accurateSum(a);
  return den === 0 ? null : accurateSum(b) / den;
}
