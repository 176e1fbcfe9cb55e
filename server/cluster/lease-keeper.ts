import type { Db } from "@/db/client";
import { leaseRound, leaveSidecars, releaseLeases, type LeasedChannel } from "@/db/queries/leases";
import type { Clock, Logger, Timer } from "../clock";

/** Channels started at once when a sidecar takes over many. */
const START_CONCURRENCY = 16;

export interface LeaseKeeperOptions {
  db: Db;
  /** SIDECAR_ID: a key unique among the sidecars sharing the database. */
  id: string;
  /** Where browsers reach this sidecar's WebSocket (SIDECAR_WS_URL). */
  wsUrl: string;
  /** A lease lives this long past its last renewal (ms); a silent sidecar's channels move after it. */
  ttlMs: number;
  /** Heartbeat and renewal period (ms), well under ttlMs. */
  heartbeatMs: number;
  clock: Clock;
  logger: Logger;
  /** Starts filtering a channel whose lease this sidecar now holds (subscribe, production filter). */
  start(channel: LeasedChannel): Promise<void>;
  /** Stops filtering a channel (unsubscribe, clear); it is released or already lost. */
  stop(path: string): Promise<void>;
  /** After each round, with the channels held (to pick up promotions made by another sidecar). */
  refresh?(held: LeasedChannel[]): Promise<void>;
}

export interface LeaseKeeper {
  /** Whether this sidecar may filter the channel now: it holds the lease and its last renewal is still in force. */
  owns(path: string): boolean;
  /** Paths held and in force now. */
  owned(): string[];
  /** One heartbeat round, resolved once the channels it handed out have started (the timer runs rounds without waiting for starts; tests may call it). */
  round(): Promise<void>;
  start(): void;
  /** Stops every channel, gives up the leases and leaves, so the others take over at once. */
  close(): Promise<void>;
}

/**
 * Keeps this sidecar's share of the channels through PostgreSQL leases (db/queries/leases.ts). Every
 * heartbeat it renews what it holds, takes free channels up to its fair share, and stops then
 * releases what is past it. It fences itself: a lease counts only until the local time the last
 * renewal started plus the ttl less a margin, so when the database cannot be reached it stops its
 * channels before any other sidecar may take them (they wait for expiry on the database's clock).
 */
export function createLeaseKeeper(opts: LeaseKeeperOptions): LeaseKeeper {
  const { clock, logger } = opts;
  /** Stop this long before the lease's own expiry: timer lateness and clock-rate differences. */
  const marginMs = Math.max(opts.heartbeatMs, opts.ttlMs / 5);
  const running = new Map<string, LeasedChannel>();
  /** Held channels waiting to start. */
  const pending = new Map<string, LeasedChannel>();
  /** Channels whose start is under way. */
  const inStart = new Set<string>();
  /** Paths the last round held. */
  let held = new Set<string>();
  let validUntil = 0;
  let inFlight: Promise<void> | null = null;
  let starting: Promise<void> | null = null;
  let timer: Timer | undefined;
  let closed = false;

  const inForce = () => clock.now() < validUntil;

  async function stopAll(why: string): Promise<void> {
    if (!running.size) return;
    logger.warn(`stopping ${running.size} channels: ${why}`);
    await stopEach([...running.keys()]);
  }

  async function stopOne(path: string): Promise<void> {
    running.delete(path);
    await opts.stop(path).catch((err: unknown) => logger.warn(`stopping ${path}: ${err instanceof Error ? err.message : String(err)}`));
  }

  /**
   * Stops channels together: each stops filtering at once (not running, so ingest drops its samples)
   * and then waits for its unsubscription, so hundreds of stops take one round trip, not hundreds.
   */
  async function stopEach(paths: string[]): Promise<void> {
    await Promise.all(paths.map(stopOne));
  }

  /** Starts one held channel; one whose lease went (or lapsed) while it started is stopped again at once. */
  async function startOne(channel: LeasedChannel): Promise<void> {
    inStart.add(channel.path);
    try {
      await opts.start(channel);
    } catch (err) {
      logger.warn(`starting ${channel.path}: ${err instanceof Error ? err.message : String(err)}`);
      return;
    } finally {
      inStart.delete(channel.path);
    }
    if (!closed && held.has(channel.path) && inForce()) running.set(channel.path, channel);
    else await stopOne(channel.path);
  }

  /**
   * Starts pending channels, START_CONCURRENCY at a time, beside the heartbeat rather than inside
   * it: taking over hundreds of channels on a busy sidecar takes seconds (a database read and a
   * subscription each), and renewals must go on meanwhile or the leases lapse before the last start.
   */
  async function startPending(): Promise<void> {
    while (pending.size && !closed && inForce()) {
      const batch: LeasedChannel[] = [];
      for (const channel of pending.values()) {
        if (batch.length === START_CONCURRENCY) break;
        batch.push(channel);
      }
      for (const channel of batch) pending.delete(channel.path);
      await Promise.all(batch.map(startOne));
    }
  }

  async function roundOnce(): Promise<void> {
    const startedAt = clock.now();
    const result = await leaseRound(opts.db, opts.id, opts.wsUrl, opts.ttlMs);
    if (closed) return;
    validUntil = startedAt + opts.ttlMs - marginMs;
    held = new Set(result.held.map((c) => c.path));
    await stopEach([...running.keys()].filter((path) => !held.has(path)));
    for (const path of [...pending.keys()]) if (!held.has(path)) pending.delete(path);
    if (result.surplus.length) {
      await releaseLeases(opts.db, opts.id, result.surplus.map((c) => c.channelId));
      logger.info(`released ${result.surplus.length} channels to the other sidecars (${result.sidecars} live)`);
    }
    for (const channel of result.held) if (!running.has(channel.path) && !inStart.has(channel.path)) pending.set(channel.path, channel);
    starting ??= startPending().finally(() => {
      starting = null;
    });
    await opts.refresh?.([...running.values()]);
  }

  /** The heartbeat's renewal; channels it hands out start beside it (startPending). */
  function renew(): Promise<void> {
    inFlight ??= roundOnce()
      .catch((err: unknown) => logger.warn(`lease round failed: ${err instanceof Error ? err.message : String(err)}`))
      .finally(() => {
        inFlight = null;
      });
    return inFlight;
  }

  const keeper: LeaseKeeper = {
    owns: (path) => running.has(path) && inForce(),
    owned: () => (inForce() ? [...running.keys()] : []),
    async round() {
      await renew();
      await starting;
    },
    start() {
      timer = clock.setInterval(() => {
        if (!inForce()) void stopAll("leases not renewed in time (database unreachable?)");
        void renew();
      }, opts.heartbeatMs);
    },
    async close() {
      closed = true;
      if (timer !== undefined) clock.clearInterval(timer);
      await inFlight;
      await starting;
      validUntil = 0;
      await stopAll("shutting down");
      await leaveSidecars(opts.db, opts.id).catch((err: unknown) =>
        logger.warn(`leaving the sidecar list: ${err instanceof Error ? err.message : String(err)}`),
      );
    },
  };
  return keeper;
}
