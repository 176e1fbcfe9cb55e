import pg from "pg";
import type { Clock, Logger, Timer } from "../clock";

/** Session-level advisory lock key held by the sidecar that runs the lab-wide work (any constant unique to it). */
export const LEADER_LOCK = 0x7461_7002;

export interface Stoppable {
  stop(): Promise<void>;
}

export interface Leadership {
  /** Whether this process holds the lock and runs the work now. */
  readonly leading: boolean;
  /** Tries once now (the timer retries every retryMs; tests may call it). */
  attempt(): Promise<void>;
  /** Stops the work and gives the lock up (closing the connection releases it). */
  close(): Promise<void>;
}

/**
 * Runs `lead` in one process at a time among all that share the database: the holder of a
 * PostgreSQL session advisory lock (pg_try_advisory_lock) on a connection of its own. Others retry
 * every retryMs; when the holder's connection ends, the lock goes with it and the next attempt of
 * another process takes over. A holder that loses its connection stops the work at once.
 */
export function startLeadership(opts: {
  databaseUrl: string;
  lead: () => Promise<Stoppable>;
  clock: Clock;
  logger: Logger;
  retryMs?: number;
  lockKey?: number;
}): Leadership {
  const key = opts.lockKey ?? LEADER_LOCK;
  let client: pg.Client | null = null;
  let work: Stoppable | null = null;
  let inFlight: Promise<void> | null = null;
  let closed = false;

  async function resign(why: string): Promise<void> {
    const running = work;
    work = null;
    const c = client;
    client = null;
    if (running) {
      opts.logger.warn(`lab-wide work stopped: ${why}`);
      await running.stop().catch((err: unknown) => opts.logger.warn(`stopping lab-wide work: ${err instanceof Error ? err.message : String(err)}`));
    }
    await c?.end().catch(() => undefined); // the connection may already be gone; ending it releases the lock either way
  }

  async function attemptOnce(): Promise<void> {
    if (closed || work) return;
    const c = new pg.Client({ connectionString: opts.databaseUrl });
    c.on("error", (err) => void resign(`lock connection lost: ${err.message}`));
    await c.connect();
    const got = await c.query<{ got: boolean }>("select pg_try_advisory_lock($1) as got", [key]);
    if (!got.rows[0]?.got || closed) {
      await c.end();
      return;
    }
    client = c;
    opts.logger.info("this sidecar runs the deployment worker, config reconciliation and outbox");
    try {
      work = await opts.lead();
    } catch (err) {
      await resign(`could not start: ${err instanceof Error ? err.message : String(err)}`);
    }
  }

  const leadership: Leadership = {
    get leading() {
      return work !== null;
    },
    attempt() {
      inFlight ??= attemptOnce()
        .catch((err: unknown) => opts.logger.warn(`leadership attempt failed: ${err instanceof Error ? err.message : String(err)}`))
        .finally(() => {
          inFlight = null;
        });
      return inFlight;
    },
    async close() {
      closed = true;
      opts.clock.clearInterval(timer);
      await inFlight;
      await resign("shutting down");
    },
  };
  const timer: Timer = opts.clock.setInterval(() => void leadership.attempt(), opts.retryMs ?? 2000);
  return leadership;
}
