/** A fixed-capacity ring of samples; `written` counts every sample ever pushed. */
export class SampleRing {
  private readonly data: Float64Array;
  written = 0;

  constructor(readonly capacity: number) {
    if (!Number.isInteger(capacity) || capacity < 1) throw new Error(`capacity must be an integer ≥ 1 (got ${capacity})`);
    this.data = new Float64Array(capacity);
  }

  push(values: ArrayLike<number>): void {
    for (let i = 0; i < values.length; i++) this.data[(this.written + i) % this.capacity] = values[i];
    this.written += values.length;
  }

  /** The `n` samples ending `endOffset` samples before the newest, oldest first; n is capped by what is held. */
  latest(n: number, endOffset = 0): Float64Array {
    const held = Math.min(this.written, this.capacity);
    const count = Math.max(0, Math.min(n, held - endOffset));
    const out = new Float64Array(count);
    const start = this.written - endOffset - count;
    for (let i = 0; i < count; i++) out[i] = this.data[(start + i) % this.capacity];
    return out;
  }
}
