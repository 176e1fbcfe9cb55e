/** A fixed-capacity ring of samples; `written` counts every sample ever pushed. */
export class SampleRing {
  private readonly data: Float64Array;
  written = 0;

  constructor(readonly capacity: number) {
    if (!Number.isInteger(capacity) || capacity < 1) throw new Error(`capacity must be an integer ≥ 1 (got ${capacity})`);
    this.data = new Float64Array(capacity);
  }

  /** Appends values (only the newest `capacity` are kept), copied by index: short batches are the rule, and typed-array views would cost more than the copy. */
  push(values: Float64Array): void {
    const skipped = Math.max(0, values.length - this.capacity);
    let at = (this.written + skipped) % this.capacity;
    for (let i = skipped; i < values.length; i++) {
      this.data[at] = values[i];
      if (++at === this.capacity) at = 0;
    }
    this.written += values.length;
  }

  /** The `n` samples ending `endOffset` samples before the newest, oldest first; n is capped by what is held. */
  latest(n: number, endOffset = 0): Float64Array {
    const held = Math.min(this.written, this.capacity);
    const count = Math.max(0, Math.min(n, held - endOffset));
    const out = new Float64Array(count);
    let at = (this.written - endOffset - count) % this.capacity;
    for (let i = 0; i < count; i++) {
      out[i] = this.data[at];
      if (++at === this.capacity) at = 0;
    }
    return out;
  }
}
