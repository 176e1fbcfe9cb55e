import pg from "pg";
import type { Clock, Logger } from "../clock";

export interface Listener {
  close(): Promise<void>;
}

/**
 * LISTENs on a PostgreSQL channel on its own connection (pooled connections cannot hold a LISTEN).
 * On a lost connection it reconnects after retryMs and calls onReconnect, so the caller can sweep
 * for anything notified while it was away.
 */
export async function listenForNotifications(opts: {
  databaseUrl: string;
  channel: string;
  onNotify: (payload: string) => void;
  onReconnect: () => void;
  clock: Clock;
  logger: Logger;
  retryMs?: number;
}): Promise<Listener> {
  const retryMs = opts.retryMs ?? 2000;
  let client: pg.Client | null = null;
  let closed = false;
  let retry: ReturnType<Clock["setTimeout"]> | null = null;

  async function connect(): Promise<void> {
    const c = new pg.Client({ connectionString: opts.databaseUrl });
    c.on("notification", (n) => {
      if (n.channel === opts.channel) opts.onNotify(n.payload ?? "");
    });
    c.on("error", (err) => {
      opts.logger.warn(`LISTEN ${opts.channel} connection lost: ${err.message}`);
      scheduleReconnect();
    });
    await c.connect();
    await c.query(`LISTEN ${opts.channel}`);
    client = c;
  }

  function scheduleReconnect(): void {
    const old = client;
    client = null;
    old?.end().catch((err: Error) => opts.logger.warn(`LISTEN ${opts.channel}: closing the lost connection failed: ${err.message}`));
    if (closed || retry) return;
    retry = opts.clock.setTimeout(() => {
      retry = null;
      connect().then(opts.onReconnect, (err: Error) => {
        opts.logger.warn(`LISTEN ${opts.channel} reconnect failed: ${err.message}`);
        scheduleReconnect();
      });
    }, retryMs);
  }

  await connect();
  return {
    async close() {
      closed = true;
      if (retry) opts.clock.clearTimeout(retry);
      await client?.end().catch((err: Error) => opts.logger.warn(`LISTEN ${opts.channel}: closing failed: ${err.message}`));
    },
  };
}
