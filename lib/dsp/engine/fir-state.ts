/** Samples filtered per pass through the scratch buffer, bounding its size for long signals. */
const CHUNK = 4096;

/**
 * FIR filter state: the last N − 1 inputs, kept at the front of a scratch buffer that the next
 * input chunk is appended to. y[n] = Σₖ h[k]·x[n − k], summed for k = 0 … N − 1 in that order
 * (direct convolution, Oppenheim & Schafer §5.7 [mem]). Unitless.
 */
export class FirState {
  private readonly taps: Float64Array;
  private readonly buffer: Float64Array;
  private readonly memory: number;

  constructor(taps: Float64Array) {
    this.taps = taps;
    this.memory = taps.length - 1;
    this.buffer = new Float64Array(this.memory + CHUNK);
  }

  /** Zero history (filter at rest). */
  clear(): void {
    this.buffer.fill(0, 0, this.memory);
  }

  /** History of a constant input v, the steady state for it (scipy.signal `lfilter_zi` equivalent). */
  settle(v: number): void {
    this.buffer.fill(v, 0, this.memory);
  }

  /** Run x[start..end) if every sample in it is finite (v − v = 0 exactly for finite v); otherwise do nothing and return false. */
  runIfFinite(x: Float64Array, y: Float64Array, start: number, end: number): boolean {
    for (let i = start; i < end; i++) if (x[i] - x[i] !== 0) return false;
    this.run(x, y, start, end);
    return true;
  }

  /** Filter x[start..end) into y[start..end), carrying the history across calls. */
  run(x: Float64Array, y: Float64Array, start: number, end: number): void {
    const { taps, buffer, memory } = this;
    const count = taps.length;
    for (let from = start; from < end; from += CHUNK) {
      const len = Math.min(CHUNK, end - from);
      buffer.set(x.subarray(from, from + len), memory);
      for (let n = 0; n < len; n++) {
        let acc = 0;
        const newest = memory + n;
        for (let k = 0; k < count; k++) acc += taps[k] * buffer[newest - k];
        y[from + n] = acc;
      }
      buffer.copyWithin(0, len, len + memory);
    }
  }
}
