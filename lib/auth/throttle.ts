/** Sign-in throttling policy: failures counted over a sliding window per account and per address. */
export const THROTTLE = {
  windowMs: 15 * 60 * 1000,
  maxPerAccount: 5,
  maxPerAddress: 20,
} as const;

/** Whether another attempt must be refused, given the failures already inside the window. */
export function isThrottled(failures: { account: number; address: number }): boolean {
  return failures.account >= THROTTLE.maxPerAccount || failures.address >= THROTTLE.maxPerAddress;
}
