/**
 * A token bucket: `burst` messages at once, refilled at `perSecond` (the usual shape for a rate with
 * bursts; times come from the caller's clock, so tests need no timers).
 */
export interface TokenBucket {
  /** Takes one token at `now` (ms); false when the bucket is empty. */
  take(now: number): boolean;
}

export function tokenBucket(perSecond: number, burst: number, now: number): TokenBucket {
  let tokens = burst;
  let last = now;
  return {
    take(at) {
      tokens = Math.min(burst, tokens + ((at - last) / 1000) * perSecond);
      last = at;
      if (tokens < 1) return false;
      tokens -= 1;
      return true;
    },
  };
}
