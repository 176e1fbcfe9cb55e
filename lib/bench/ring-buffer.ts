/** A read-only view of aligned columns: one x column and `series` y columns (NaN marks a gap). */
export interface ColumnView {
  readonly length: number;
  readonly series: number;
  x(i: number): number;
  y(series: number, i: number): number;
}

/**
 * Fixed-capacity ring of live samples: a time column in seconds (Float64) and one Float32 column per
 * trace slot. The oldest rows are overwritten once full; index 0 is always the oldest row kept.
 */
export class TraceRing implements ColumnView {
  readonly capacity: number;
  readonly series: number;
  private readonly t: Float64Array;
  private readonly cols: Float32Array[];
  private head = 0;
  private count = 0;

  constructor(capacity: number, series: number) {
    if (!Number.isInteger(capacity) || capacity < 2) throw new Error(`capacity must be an integer ≥ 2 (got ${capacity})`);
    if (!Number.isInteger(series) || series < 1) throw new Error(`series must be an integer ≥ 1 (got ${series})`);
    this.capacity = capacity;
    this.series = series;
    this.t = new Float64Array(capacity);
    this.cols = Array.from({ length: series }, () => new Float32Array(capacity).fill(NaN));
  }

  get length(): number {
    return this.count;
  }

  private physical(i: number): number {
    return (this.head - this.count + i + this.capacity) % this.capacity;
  }

  x(i: number): number {
    return this.t[this.physical(i)];
  }

  y(series: number, i: number): number {
    return this.cols[series][this.physical(i)];
  }

  /** Time of the newest row in s, or NaN when empty. */
  lastX(): number {
    return this.count === 0 ? NaN : this.x(this.count - 1);
  }

  /**
   * Appends n rows at t0 + k·dt s (k = 0 … n − 1). columns[s] holds series s's n values; a missing
   * column writes NaN (a gap) for that series.
   */
  pushBlock(t0: number, dt: number, n: number, columns: ReadonlyArray<ArrayLike<number> | undefined>): void {
    for (let k = 0; k < n; k++) {
      const p = this.head;
      this.t[p] = t0 + k * dt;
      for (let s = 0; s < this.series; s++) {
        const col = columns[s];
        this.cols[s][p] = col === undefined ? NaN : col[k];
      }
      this.head = (p + 1) % this.capacity;
      if (this.count < this.capacity) this.count++;
    }
  }

  /** First index whose time is ≥ x (binary search; times are ascending), or length if none. */
  lowerBound(x: number): number {
    let lo = 0;
    let hi = this.count;
    while (lo < hi) {
      const mid = (lo + hi) >>> 1;
      if (this.x(mid) < x) lo = mid + 1;
      else hi = mid;
    }
    return lo;
  }

  /** Copies series s over rows [from, to) into a new Float64Array. */
  copySeries(series: number, from: number, to: number): Float64Array {
    const out = new Float64Array(Math.max(0, to - from));
    for (let i = from; i < to; i++) out[i - from] = this.y(series, i);
    return out;
  }

  /** Forgets one series' history (a freed candidate slot). */
  clearSeries(series: number): void {
    this.cols[series].fill(NaN);
  }

  clear(): void {
    this.head = 0;
    this.count = 0;
    for (const c of this.cols) c.fill(NaN);
  }
}
