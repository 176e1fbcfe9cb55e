/**
 * Smoothing factor of the exponential moving average y[n] = y[n−1] + α·(x[n] − y[n−1]):
 * α = 1 − e^{−2π·fc/fs} (common practice: the pole e^{−2π·fc/fs} is the ZOH image of a first-order
 * low-pass with corner fc in Hz). fs = 1 kHz, fc = 10 Hz gives α = 0.060899.
 */
export function emaAlpha(cutoffHz: number, sampleRateHz: number): number {
  const nyquist = sampleRateHz / 2;
  if (!(cutoffHz > 0 && cutoffHz < nyquist)) {
    throw new Error(`cutoffHz must be above 0 and below the Nyquist frequency ${nyquist} Hz (got ${cutoffHz})`);
  }
  return 1 - Math.exp((-2 * Math.PI * cutoffHz) / sampleRateHz);
}

/** The EMA as a transfer function: b = [α], a = [1, α − 1] (coefficients of z⁰, z⁻¹). */
export function emaTransferFunction(cutoffHz: number, sampleRateHz: number): { b: number[]; a: number[] } {
  const alpha = emaAlpha(cutoffHz, sampleRateHz);
  return { b: [alpha], a: [1, alpha - 1] };
}
