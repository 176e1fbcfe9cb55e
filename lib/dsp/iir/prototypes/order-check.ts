/** Analog prototypes need an integer order ≥ 1 (common practice). */
export function requireOrder(order: number): void {
  if (!(Number.isInteger(order) && order >= 1)) {
    throw new Error(`filter order must be an integer ≥ 1 (got ${order})`);
  }
}

/** A decibel figure (ripple or attenuation) must be finite and > 0 dB. */
export function requirePositiveDb(name: string, db: number): void {
  if (!(Number.isFinite(db) && db > 0)) throw new Error(`${name} must be a finite number > 0 dB (got ${db})`);
}
