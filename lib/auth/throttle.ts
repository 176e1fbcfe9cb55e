/**
 * Sign-in throttling policy. Failures are counted per key: the account (its e-mail), the client's
 * address, and the browser when it carries a device cookie from an earlier sign-in to that account.
 * A key's first `free` failures cost nothing; each one after that makes the key wait
 * min(maxMs, baseMs · 2^(n − free − 1)) before its next try (n = its failures so far). A key forgets
 * its failures a day after the last one, and a successful sign-in clears the account's and the
 * browser's count.
 *
 * Which keys hold an attempt back decides who a stranger can slow down:
 * - a browser with a device cookie for this account is held back only by its own failures, so
 *   strangers failing from the same address or against the same account never lock out the owner;
 * - any other attempt is held back by its address, and by the account only once that address has
 *   failed before: a correct password from an address that has not been failing still gets in,
 *   while a guesser meets the account's delay from its second try on.
 */
export interface ThrottlePolicy {
  /** Failures an account or a browser may make without waiting. */
  freePerAccount: number;
  /** Failures an address may make without waiting (several people may share one). */
  freePerAddress: number;
  baseMs: number;
  maxMs: number;
}

/** How long after its last failure a key forgets its count, ms. */
export const FORGET_AFTER_MS = 24 * 60 * 60 * 1000;

/** The keys of one attempt. */
export interface AttemptKeys {
  account: string;
  address: string | null;
  device: string | null;
}

export function attemptKeys(email: string, address: string | null, deviceId: string | null): AttemptKeys {
  return {
    account: `account:${email.toLowerCase()}`,
    address: address === null ? null : `address:${address}`,
    device: deviceId === null ? null : `device:${deviceId}`,
  };
}

/** A key's counter as stored: failures so far and until when it must wait (epoch ms). */
export interface Counter {
  failures: number;
  lastFailureAt: number;
  blockedUntil: number | null;
}

/** The keys an attempt counts a failure against, with the number of failures each may make for free. */
export function countedKeys(keys: AttemptKeys, policy: ThrottlePolicy): Array<{ key: string; free: number }> {
  const out = [{ key: keys.account, free: policy.freePerAccount }];
  if (keys.address) out.push({ key: keys.address, free: policy.freePerAddress });
  if (keys.device) out.push({ key: keys.device, free: policy.freePerAccount });
  return out;
}

/** A counter as of `now`: failures older than FORGET_AFTER_MS are forgotten. */
export function current(counter: Counter | undefined, now: number): Counter {
  if (!counter || now - counter.lastFailureAt > FORGET_AFTER_MS) return { failures: 0, lastFailureAt: now, blockedUntil: null };
  return counter;
}

/** The keys that may hold this attempt back (see the module comment). */
export function enforcedKeys(keys: AttemptKeys, counters: Map<string, Counter>, now: number): string[] {
  if (keys.device) return [keys.device];
  if (!keys.address) return [keys.account];
  const addressFailed = current(counters.get(keys.address), now).failures > 0;
  return addressFailed ? [keys.address, keys.account] : [keys.address];
}

/** Milliseconds the attempt must still wait, or 0 when it may go ahead. */
export function waitMs(keys: AttemptKeys, counters: Map<string, Counter>, now: number): number {
  const until = enforcedKeys(keys, counters, now).map((k) => current(counters.get(k), now).blockedUntil ?? 0);
  return Math.max(0, ...until.map((t) => t - now));
}

/** The delay after a key's n-th failure: none for the free ones, then doubling from baseMs up to maxMs. */
export function delayAfter(failures: number, free: number, policy: ThrottlePolicy): number {
  if (failures <= free) return 0;
  return Math.min(policy.maxMs, policy.baseMs * 2 ** Math.min(failures - free - 1, 40));
}

/** A counter after one more failure at `now`. */
export function withFailure(counter: Counter | undefined, free: number, policy: ThrottlePolicy, now: number): Counter {
  const failures = current(counter, now).failures + 1;
  const delay = delayAfter(failures, free, policy);
  return { failures, lastFailureAt: now, blockedUntil: delay > 0 ? now + delay : null };
}

/** The policy from the environment's LOGIN_* settings. */
export function throttlePolicy(e: {
  LOGIN_FREE_FAILURES: number;
  LOGIN_FREE_FAILURES_PER_ADDRESS: number;
  LOGIN_DELAY_BASE_MS: number;
  LOGIN_DELAY_MAX_MS: number;
}): ThrottlePolicy {
  return { freePerAccount: e.LOGIN_FREE_FAILURES, freePerAddress: e.LOGIN_FREE_FAILURES_PER_ADDRESS, baseMs: e.LOGIN_DELAY_BASE_MS, maxMs: e.LOGIN_DELAY_MAX_MS };
}
