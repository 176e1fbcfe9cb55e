import { sql, type Transaction } from "kysely";
import {
  countedKeys,
  FORGET_AFTER_MS,
  waitMs,
  withFailure,
  type AttemptKeys,
  type Counter,
  type ThrottlePolicy,
} from "@/lib/auth/throttle";
import type { Db } from "../client";
import type { Database } from "../types";

const asDate = (ms: number | null) => (ms === null ? null : new Date(ms));

/** The counters of these keys, locked for this transaction (rows are created first so there is always one to lock). */
async function lockCounters(trx: Transaction<Database>, keys: string[]): Promise<{ now: number; counters: Map<string, Counter> }> {
  const sorted = [...keys].sort();
  await trx
    .insertInto("login_throttle")
    .values(sorted.map((key) => ({ key })))
    .onConflict((oc) => oc.column("key").doNothing())
    .execute();
  const rows = await trx
    .selectFrom("login_throttle")
    .select(["key", "failures", "last_failure_at", "blocked_until"])
    .where("key", "in", sorted)
    .orderBy("key")
    .forUpdate()
    .execute();
  // The time once the locks are held (now() would be the transaction's start, before any wait for them).
  const { at } = await sql<{ at: Date }>`select clock_timestamp() as at`.execute(trx).then((r) => r.rows[0]);
  const counters = new Map(
    rows.map((r): [string, Counter] => [r.key, { failures: r.failures, lastFailureAt: r.last_failure_at.getTime(), blockedUntil: r.blocked_until?.getTime() ?? null }]),
  );
  return { now: at.getTime(), counters };
}

/**
 * Takes a sign-in attempt's place in the count before the password is checked, so parallel attempts
 * are counted one after another (row locks, the database's clock once they are held): when a key that holds this
 * attempt back must still wait, nothing is counted and the wait is returned; otherwise the attempt
 * is counted as a failure on every key (releaseLoginAttempt takes it back when it succeeds) and 0
 * is returned.
 */
export async function reserveLoginAttempt(db: Db, keys: AttemptKeys, policy: ThrottlePolicy): Promise<number> {
  const counted = countedKeys(keys, policy);
  return db.transaction().execute(async (trx) => {
    const { now, counters } = await lockCounters(trx, counted.map((c) => c.key));
    const wait = waitMs(keys, counters, now);
    if (wait > 0) return wait;
    for (const { key, free } of counted) {
      const next = withFailure(counters.get(key), free, policy, now);
      await trx
        .updateTable("login_throttle")
        .set({ failures: next.failures, last_failure_at: new Date(next.lastFailureAt), blocked_until: asDate(next.blockedUntil) })
        .where("key", "=", key)
        .execute();
    }
    return 0;
  });
}

/**
 * A reserved attempt succeeded: the account's and the browser's counts start over, the address's
 * count loses this attempt again (other people's failures from it stay), and counters idle for a
 * day are deleted.
 */
export async function releaseLoginAttempt(db: Db, keys: AttemptKeys, policy: ThrottlePolicy): Promise<void> {
  await db.transaction().execute(async (trx) => {
    await trx
      .deleteFrom("login_throttle")
      .where("key", "in", [keys.account, keys.device].filter((k): k is string => k !== null))
      .execute();
    if (keys.address) {
      await trx
        .updateTable("login_throttle")
        .set({
          failures: sql<number>`greatest(failures - 1, 0)`,
          blocked_until: sql<Date | null>`case when failures - 1 > ${policy.freePerAddress} then blocked_until end`,
        })
        .where("key", "=", keys.address)
        .execute();
    }
    await trx
      .deleteFrom("login_throttle")
      .where("last_failure_at", "<", sql<Date>`now() - make_interval(secs => ${FORGET_AFTER_MS / 1000})`)
      .where((eb) => eb.or([eb("blocked_until", "is", null), eb("blocked_until", "<", sql<Date>`now()`)]))
      .execute();
  });
}
