/**
 * Samples appended batch by batch into one typed array that doubles when full and is emptied for
 * reuse (reset), so a channel's staging allocates nothing once it has grown to a tick's samples.
 */
export class GrowingColumn {
  private data: Float64Array;
  length = 0;

  constructor(capacity: number) {
    this.data = new Float64Array(Math.max(1, capacity));
  }

  append(values: Float64Array): void {
    const needed = this.length + values.length;
    if (needed > this.data.length) {
      const grown = new Float64Array(Math.max(needed, 2 * this.data.length));
      grown.set(this.data.subarray(0, this.length));
      this.data = grown;
    }
    this.data.set(values, this.length);
    this.length = needed;
  }

  /** Samples [start, end) appended so far, as a view: valid until the column is reset and appended to again. */
  view(start = 0, end = this.length): Float64Array {
    return this.data.subarray(start, end);
  }

  /** Empties the column, keeping its memory for the next appends. */
  reset(): void {
    this.length = 0;
  }
}
