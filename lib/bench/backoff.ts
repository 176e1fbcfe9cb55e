/** Reconnect delays: 0.5 s doubling per failed attempt up to 15 s (exponential backoff, common practice). */
export const BACKOFF = { firstMs: 500, maxMs: 15_000, jitter: 0.2 } as const;

/**
 * Milliseconds to wait before reconnect attempt `attempt` (0 = the first retry); `random` in [0, 1)
 * spreads it by ±20 % so that many browsers do not return at the same instant.
 */
export function reconnectDelayMs(attempt: number, random: number): number {
  if (!Number.isInteger(attempt) || attempt < 0) throw new Error(`attempt must be an integer ≥ 0 (got ${attempt})`);
  const base = Math.min(BACKOFF.maxMs, BACKOFF.firstMs * 2 ** Math.min(attempt, 30));
  return Math.round(base * (1 + BACKOFF.jitter * (2 * random - 1)));
}
