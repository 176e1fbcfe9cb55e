/**
 * First-difference (backward difference) differentiator y[n] = fs·(x[n] − x[n−1]), output in input
 * units per second; |H(f)| = 2·fs·sin(πf/fs), half a sample of delay (Franklin, Powell & Workman
 * §6.2; Oppenheim & Schafer, Discrete-Time Signal Processing, 3rd ed., §7.2).
 */
export function firstDifferenceTaps(sampleRateHz: number): number[] {
  if (!Number.isFinite(sampleRateHz) || sampleRateHz <= 0) {
    throw new Error(`sampleRateHz must be a finite number above 0 Hz (got ${sampleRateHz})`);
  }
  return [sampleRateHz, -sampleRateHz];
}
