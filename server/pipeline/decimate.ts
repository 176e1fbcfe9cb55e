/**
 * Min/max decimation: each bucket of `bucket` consecutive samples becomes two points, its minimum
 * and its maximum in the order they occurred (a bucket of one sample gives that sample twice), so
 * every extreme survives and the trace's envelope is kept (common practice for plotting long series).
 */
export function minMaxDecimate(values: ArrayLike<number>, bucket: number, out: number[] = []): number[] {
  if (!Number.isInteger(bucket) || bucket < 1) throw new Error(`bucket must be an integer ≥ 1 (got ${bucket})`);
  for (let start = 0; start < values.length; start += bucket) {
    const end = Math.min(values.length, start + bucket);
    let lo = start;
    let hi = start;
    for (let i = start + 1; i < end; i++) {
      if (values[i] < values[lo]) lo = i;
      if (values[i] > values[hi]) hi = i;
    }
    if (lo <= hi) out.push(values[lo], values[hi]);
    else out.push(values[hi], values[lo]);
  }
  return out;
}

/** Samples per bucket so that a window of `windowSamples` shows at most `maxPoints` points (2 per bucket); 1 = no decimation. */
export function bucketSize(windowSamples: number, maxPoints: number): number {
  if (windowSamples <= maxPoints) return 1;
  return Math.ceil(windowSamples / Math.floor(maxPoints / 2));
}
