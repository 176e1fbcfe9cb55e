/** Lowest magnitude reported, in dB: |H| below 10^(−400/20) (exact zeros included) reads −400 dB, so results stay finite for JSON. */
export const MAGNITUDE_FLOOR_DB = -400;

/** 20·log10|h| in dB, floored at MAGNITUDE_FLOOR_DB (common practice). */
export function magnitudeToDb(absH: number): number {
  if (!(absH >= 0)) throw new Error(`a magnitude must be a number ≥ 0 (got ${absH})`);
  return Math.max(20 * Math.log10(absH), MAGNITUDE_FLOOR_DB);
}

/** A delay in samples as milliseconds at sample rate fs in Hz: 1000·samples/fs (common practice). */
export function toMs(samples: number, sampleRateHz: number): number {
  if (!Number.isFinite(sampleRateHz) || sampleRateHz <= 0) {
    throw new Error(`sampleRateHz must be a finite number > 0 Hz (got ${sampleRateHz})`);
  }
  return (1000 * samples) / sampleRateHz;
}

/** 10·log10(p) in dB for a power or PSD p ≥ 0, floored at MAGNITUDE_FLOOR_DB (common practice). */
export function powerToDb(p: number): number {
  if (!(p >= 0)) throw new Error(`a power must be a number ≥ 0 (got ${p})`);
  return Math.max(10 * Math.log10(p), MAGNITUDE_FLOOR_DB);
}
