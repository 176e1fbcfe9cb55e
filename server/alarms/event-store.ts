import type { AlarmEventRecord } from "@/db/queries/alarm-events";
import type { Clock, Logger, Timer } from "../clock";

export interface EventStoreStats {
  /** Events waiting to be written (the database is down or slow). */
  buffered: number;
  /** Cleared events dropped unwritten because the buffer was full (open ones are never dropped). */
  dropped: number;
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
 * per rule, so they are bounded by the rules).
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
  const counts = { dropped: 0, written: 0 };
  let writing: Promise<boolean> | null = null;
  let failingSince: number | null = null;
  let again = false;

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
        if (failingSince === null) {
          failingSince = deps.clock.now();
          deps.logger.warn(`alarm events not written, keeping ${pending.size} in memory and retrying: ${err instanceof Error ? err.message : String(err)}`);
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

  function flush(): Promise<boolean> {
    if (writing) {
      again = true;
      return writing;
    }
    writing = writeOnce().finally(() => {
      writing = null;
      if (again) {
        again = false;
        void flush();
      }
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
    stats: () => ({ buffered: pending.size, dropped: counts.dropped, written: counts.written }),
    async close() {
      deps.clock.clearInterval(timer);
      await writing;
      if (pending.size > 0 && !(await flush())) deps.logger.warn(`${pending.size} alarm events were not written before shutdown`);
    },
  };
}
