/** A channel's recent envelope for the overview: consecutive buckets, each its minimum and maximum. */
export interface Spark {
  /** Time of the first bucket's first sample, epoch ms (the device's sample clock). */
  t0: number;
  /** Duration of one bucket, ms. */
  stepMs: number;
  min: number[];
  max: number[];
}

/**
 * Keeps the last `buckets` whole buckets of about `bucketMs` each (min/max decimation, common
 * practice for plotting long series), updated sample by sample so a read costs O(buckets).
 * Buckets are consecutive samples; when a batch does not start within one bucket of where the
 * previous one ended (a gap or a device clock jump), the envelope starts over so that
 * `t0 + i·stepMs` stays true.
 */
export class SparkEnvelope {
  private readonly bucketSamples: number;
  private readonly stepMs: number;
  private readonly min: Float64Array;
  private readonly max: Float64Array;
  private readonly starts: Float64Array;
  /** Whole buckets written since the last restart. */
  private whole = 0;
  private current = { start: 0, min: Infinity, max: -Infinity, count: 0 };
  /** Epoch ms the next sample is expected at, or null before the first. */
  private expected: number | null = null;

  constructor(
    private readonly sampleRateHz: number,
    private readonly buckets = 60,
    bucketMs = 500,
  ) {
    if (!(sampleRateHz > 0)) throw new Error(`sampleRateHz must be > 0 (got ${sampleRateHz})`);
    if (!Number.isInteger(buckets) || buckets < 1) throw new Error(`buckets must be an integer ≥ 1 (got ${buckets})`);
    if (!(bucketMs > 0)) throw new Error(`bucketMs must be > 0 (got ${bucketMs})`);
    this.bucketSamples = Math.max(1, Math.round((bucketMs * sampleRateHz) / 1000));
    this.stepMs = (this.bucketSamples * 1000) / sampleRateHz;
    this.min = new Float64Array(buckets);
    this.max = new Float64Array(buckets);
    this.starts = new Float64Array(buckets);
  }

  /** Adds a batch whose first value was taken at t0 (epoch ms). */
  push(t0: number, values: ArrayLike<number>): void {
    const dt = 1000 / this.sampleRateHz;
    if (this.expected !== null && Math.abs(t0 - this.expected) > this.stepMs) this.restart();
    const cur = this.current;
    for (let i = 0; i < values.length; i++) {
      if (cur.count === 0) cur.start = t0 + i * dt;
      const v = values[i];
      if (v < cur.min) cur.min = v;
      if (v > cur.max) cur.max = v;
      if (++cur.count === this.bucketSamples) {
        const slot = this.whole % this.buckets;
        this.min[slot] = cur.min;
        this.max[slot] = cur.max;
        this.starts[slot] = cur.start;
        this.whole++;
        cur.min = Infinity;
        cur.max = -Infinity;
        cur.count = 0;
      }
    }
    this.expected = t0 + values.length * dt;
  }

  /** The whole buckets held, oldest first; null before the first bucket is complete. */
  read(): Spark | null {
    const held = Math.min(this.whole, this.buckets);
    if (held === 0) return null;
    const first = this.whole - held;
    const min: number[] = [];
    const max: number[] = [];
    for (let i = 0; i < held; i++) {
      const slot = (first + i) % this.buckets;
      min.push(this.min[slot]);
      max.push(this.max[slot]);
    }
    return { t0: this.starts[first % this.buckets], stepMs: this.stepMs, min, max };
  }

  private restart(): void {
    this.whole = 0;
    this.current = { start: 0, min: Infinity, max: -Infinity, count: 0 };
  }
}
