/** Shapes of the bandwidth-convention notch and comb: a notch (stop) or a peak (pass) at the centre. */
export const notchShapes = ["notch", "peak"] as const;

export type NotchShape = (typeof notchShapes)[number];

/**
 * β = tan(Δω/2) for a −3 dB bandwidth Δω in rad/sample, the edge gain being G_B = 1/√2 (S. J.
 * Orfanidis, Introduction to Signal Processing, Prentice Hall, 1996, eqs. 11.3.4 and 11.3.19, where
 * the factors √(1 − G_B²)/G_B and G_B/√(1 − G_B²) are both 1 at G_B² = 1/2).
 */
export function bandwidthBeta(bandwidthRad: number): number {
  return Math.tan(bandwidthRad / 2);
}

/**
 * A second-order notch or peak in the bandwidth convention, q = f0 / (−3 dB bandwidth), as
 * scipy.signal.iirnotch / iirpeak (Orfanidis 1996, eqs. 11.3.6, 11.3.7 and 11.3.21): with
 * ω0 = 2π·f0/fs, Δω = ω0/q, β = tan(Δω/2) and g = 1/(1 + β),
 * notch b = g·[1, −2·cos ω0, 1]; peak b = (1 − g)·[1, 0, −1]; a = [1, −2·g·cos ω0, 2·g − 1].
 * Returns the section [b0, b1, b2, 1, a1, a2]. Needs 0 < f0 < fs/2, q > 0 and Δω < π (Hz in, unitless out).
 */
export function bandwidthNotchSection(shape: NotchShape, centerHz: number, q: number, sampleRateHz: number): number[] {
  const normalised = (2 * centerHz) / sampleRateHz;
  if (!(normalised > 0 && normalised < 1)) {
    throw new Error(`centerHz must satisfy 0 < f < ${sampleRateHz / 2} Hz (got ${centerHz})`);
  }
  const bandwidth = (normalised / q) * Math.PI;
  if (!(q > 0 && bandwidth < Math.PI)) {
    throw new Error(`the −3 dB bandwidth centerHz/q must be below sampleRateHz/2 (got q = ${q})`);
  }
  const w0 = normalised * Math.PI;
  const g = 1 / (1 + bandwidthBeta(bandwidth));
  const c = Math.cos(w0);
  const b = shape === "notch" ? [g, -2 * c * g, g] : [1 - g, 0, -(1 - g)];
  return [...b, 1, -2 * g * c, 2 * g - 1];
}
