import type { Clock } from "../clock";

/** Failed broker sign-ins remembered per key (a username or an address) within a window. */
interface Failures {
  count: number;
  lastAt: number;
}

export interface SignInThrottleOptions {
  /** Failures forgotten after this long without a new one (ms). */
  windowMs?: number;
  /** Failures allowed before any delay. */
  freeFailures?: number;
  /** First delay once past the free failures; doubles with each further failure (ms). */
  baseDelayMs?: number;
  /** Longest delay (ms). */
  maxDelayMs?: number;
  /** Most keys remembered; the oldest are forgotten first (bounds memory under a flood of made-up names). */
  maxKeys?: number;
}

/**
 * Growing delays for wrong broker passwords, per address and per username: a client that keeps
 * failing waits longer before each answer (doubling up to maxDelayMs). The username's delay applies
 * only to an address that has failed too, so a stranger hammering a device's name slows himself
 * down without keeping the real device, signing in from a clean address, out.
 */
export class SignInThrottle {
  private readonly failures = new Map<string, Failures>();
  private readonly windowMs: number;
  private readonly free: number;
  private readonly base: number;
  private readonly max: number;
  private readonly maxKeys: number;

  constructor(
    private readonly clock: Pick<Clock, "now">,
    opts: SignInThrottleOptions = {},
  ) {
    this.windowMs = opts.windowMs ?? 15 * 60_000;
    this.free = opts.freeFailures ?? 3;
    this.base = opts.baseDelayMs ?? 250;
    this.max = opts.maxDelayMs ?? 8_000;
    this.maxKeys = opts.maxKeys ?? 10_000;
  }

  /** How long to hold the answer to a sign-in from this address for this username (ms). */
  delayMs(username: string, address: string): number {
    const byAddress = this.delayFor(`a:${address}`);
    if (this.count(`a:${address}`) === 0) return 0;
    return Math.min(this.max, byAddress + this.delayFor(`u:${username}`));
  }

  fail(username: string, address: string): void {
    for (const key of [`u:${username}`, `a:${address}`]) {
      const now = this.clock.now();
      const count = this.count(key) + 1;
      this.failures.delete(key);
      this.failures.set(key, { count, lastAt: now });
    }
    while (this.failures.size > this.maxKeys) {
      const oldest = this.failures.keys().next().value;
      if (oldest === undefined) break;
      this.failures.delete(oldest);
    }
  }

  /** A correct password clears the address's record (the username's stays until its window ends). */
  succeed(address: string): void {
    this.failures.delete(`a:${address}`);
  }

  private count(key: string): number {
    const f = this.failures.get(key);
    if (!f) return 0;
    if (this.clock.now() - f.lastAt > this.windowMs) {
      this.failures.delete(key);
      return 0;
    }
    return f.count;
  }

  private delayFor(key: string): number {
    const over = this.count(key) - this.free;
    return over <= 0 ? 0 : Math.min(this.max, this.base * 2 ** (over - 1));
  }
}
