import type { AlarmEventRecord } from "@/db/queries/alarm-events";
import { errorMessage, isDatabaseDown } from "@/lib/errors";
import type { Clock, Logger, Timer } from "../clock";

export interface EventStoreStats {
  /** Events waiting to be written (the database is down or slow). */
  buffered: number;
  /** Cleared events dropped unwritten because the buffer was full (open ones are never dropped). */
  dropped: number;
  /** Events the database refused on their own (not an outage), logged and dropped. */
  rejected: number;
  written: number;
}

export interface EventStore {
  /** Takes an event's current state; it replaces any unwritten older state of the same event. */
  put(record: AlarmEventRecord): void;
  /** Writes what is buffered now; resolves false when the write failed (the events stay buffered). */
  flush(): Promise<boolean>;
  stats(): EventStoreStats;
  /** Stops the retry timer after a last attempt to write. */
  close(): Promise<void>;
}

/** Most events held while the database cannot be reached. */
export const MAX_BUFFERED_EVENTS = 10_000;

/**
 * Writes alarm events through `write`, keeping them in memory until a write succeeds: while the
 * database is down they wait (one entry per event, its newest state) and are retried every retryMs,
 * in the order they were raised. The buffer is bounded: past maxBuffered the oldest cleared events
 * are dropped (counted and logged); events still raised are never dropped (there are at most two
 * per rule, so they are bounded by the rules). A batch refused for any other reason than an outage is
 * written event by event, and an event the database refuses on its own is logged and dropped so it
 * cannot hold up the others.
 */
export function createEventStore(deps: {
  write: (records: AlarmEventRecord[]) => Promise<void>;
  clock: Clock;
  logger: Logger;
  maxBuffered?: number;
  retryMs?: number;
  batchSize?: number;
}): EventStore {
  const max = deps.maxBuffered ?? MAX_BUFFERED_EVENTS;
  const batchSize = deps.batchSize ?? 500;
  const pending = new Map<string, AlarmEventRecord>();
  const counts = { dropped: 0, rejected: 0, written: 0 };
  let writing: Promise<boolean> | null = null;
  /** One write queued behind the running one, shared by every flush asked for meanwhile. */
  let follow: Promise<boolean> | null = null;
  let failingSince: number | null = null;

  function makeRoom(): void {
    for (const [id, r] of pending) {
      if (pending.size < max) return;
      if (r.state !== "cleared") continue;
      pending.delete(id);
      counts.dropped++;
      deps.logger.warn(`alarm event ${id} (rule ${r.ruleId}, cleared) dropped unwritten: ${max} events are waiting for the database`);
    }
  }

  async function writeOnce(): Promise<boolean> {
    while (pending.size > 0) {
      const batch = [...pending.values()].slice(0, batchSize);
      try {
        await deps.write(batch);
      } catch (err) {
        if (!isDatabaseDown(err)) {
          if (await writeSingly(batch)) continue;
          return false;
        }
        if (failingSince === null) {
          failingSince = deps.clock.now();
          deps.logger.warn(`alarm events not written, keeping ${pending.size} in memory and retrying: ${errorMessage(err)}`);
        }
        return false;
      }
      // An event that changed while it was being written keeps its newer state for the next round.
      for (const r of batch) if (pending.get(r.id) === r) pending.delete(r.id);
      counts.written += batch.length;
      if (failingSince !== null) {
        deps.logger.info(`alarm events written again after ${Math.round((deps.clock.now() - failingSince) / 1000)} s`);
        failingSince = null;
      }
    }
    return true;
  }

  /** Writes a refused batch one event at a time; false when the database went down meanwhile. */
  async function writeSingly(batch: AlarmEventRecord[]): Promise<boolean> {
    for (const r of batch) {
      try {
        await deps.write([r]);
        counts.written++;
      } catch (err) {
        if (isDatabaseDown(err)) return false;
        counts.rejected++;
        deps.logger.warn(`alarm event ${r.id} (rule ${r.ruleId}) refused by the database and dropped: ${errorMessage(err)}`);
      }
      if (pending.get(r.id) === r) pending.delete(r.id);
    }
    return true;
  }

  function flush(): Promise<boolean> {
    if (writing) {
      follow ??= writing.then(() => {
        follow = null;
        return flush();
      });
      return follow;
    }
    writing = writeOnce().finally(() => {
      writing = null;
    });
    return writing;
  }

  const timer: Timer = deps.clock.setInterval(() => {
    if (pending.size > 0) void flush();
  }, deps.retryMs ?? 1000);

  return {
    put(record) {
      if (!pending.has(record.id)) makeRoom();
      pending.set(record.id, record);
      if (failingSince === null) void flush();
    },
    flush,
    stats: () => ({ buffered: pending.size, ...counts }),
    async close() {
      deps.clock.clearInterval(timer);
      if (pending.size > 0 && !(await flush())) deps.logger.warn(`${pending.size} alarm events were not written before shutdown`);
    },
  };
}
