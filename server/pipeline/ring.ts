/** A fixed-capacity ring of samples; `written` counts every sample ever pushed. */
export class SampleRing {
  private readonly data: Float64Array;
  written = 0;

  constructor(readonly capacity: number) {
    if (!Number.isInteger(capacity) || capacity < 1) throw new Error(`capacity must be an integer ≥ 1 (got ${capacity})`);
    this.data = new Float64Array(capacity);
  }

  /** Appends values (only the newest `capacity` are kept) as at most two block copies. */
  push(values: Float64Array): void {
    const kept = values.length > this.capacity ? values.subarray(values.length - this.capacity) : values;
    const at = (this.written + values.length - kept.length) % this.capacity;
    const first = Math.min(kept.length, this.capacity - at);
    this.data.set(first === kept.length ? kept : kept.subarray(0, first), at);
    if (first < kept.length) this.data.set(kept.subarray(first), 0);
    this.written += values.length;
  }

  /** The `n` samples ending `endOffset` samples before the newest, oldest first; n is capped by what is held. */
  latest(n: number, endOffset = 0): Float64Array {
    const held = Math.min(this.written, this.capacity);
    const count = Math.max(0, Math.min(n, held - endOffset));
    const out = new Float64Array(count);
    const at = (this.written - endOffset - count) % this.capacity;
    const first = Math.min(count, this.capacity - at);
    out.set(this.data.subarray(at, at + first));
    if (first < count) out.set(this.data.subarray(0, count - first), first);
    return out;
  }
}
