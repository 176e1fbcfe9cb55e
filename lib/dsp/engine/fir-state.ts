import { firKernel, type FirKernel } from "./fir-kernel";

/** Samples filtered per pass through the scratch buffer, bounding its size for long signals. */
const CHUNK = 4096;

/**
 * FIR filter state: the last N − 1 inputs, kept at the front of a scratch buffer that the next
 * input chunk is appended to; the convolution itself is a FirKernel. Unitless.
 */
export class FirState {
  private readonly kernel: FirKernel;
  private readonly buffer: Float64Array;
  private readonly memory: number;

  constructor(taps: Float64Array) {
    this.kernel = firKernel(taps);
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
    const { buffer, memory } = this;
    for (let from = start; from < end; from += CHUNK) {
      const len = Math.min(CHUNK, end - from);
      buffer.set(x.subarray(from, from + len), memory);
      this.kernel(buffer, y, memory, len, from);
      buffer.copyWithin(0, len, len + memory);
    }
  }
}
