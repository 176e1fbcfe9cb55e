import { afterEach, beforeEach, describe, expect, it, vi } from "vitest";
import { createDb } from "@/db/client";
import type { LeasedChannel, LeaseRound } from "@/db/queries/leases";
import type { Clock } from "@/server/clock";

/** The lease queries stand in for PostgreSQL: each round holds what `holding` says. */
let holding: LeasedChannel[] = [];
let rounds = 0;
vi.mock("@/db/queries/leases", () => ({
  leaseRound: async (): Promise<LeaseRound> => {
    rounds++;
    return { held: holding, surplus: [], sidecars: 1 };
  },
  releaseLeases: async () => undefined,
  leaveSidecars: async () => undefined,
}));

const { createLeaseKeeper } = await import("@/server/cluster/lease-keeper");
/** Never queried: the lease queries above stand in for it (a pool connects on its first query only). */
const unusedDb = createDb("postgres://unused@127.0.0.1:9/unused", 1);

const clock: Clock = {
  now: () => Date.now(),
  setInterval: (fn, ms) => setInterval(fn, ms),
  clearInterval: (t) => clearInterval(t),
  setTimeout: (fn, ms) => setTimeout(fn, ms),
  clearTimeout: (t) => clearTimeout(t),
};
const channel = (i: number): LeasedChannel => ({ channelId: i, path: `lab/node/ch-${i}`, sampleRateHz: 1000 });

/** A keeper whose channel starts each take `startMs` (a database read and a subscription on a busy sidecar), and stops `stopMs` (an unsubscription). */
function keeper(startMs: number, stopMs = 0) {
  const started: string[] = [];
  const stopped: string[] = [];
  const warnings: string[] = [];
  const k = createLeaseKeeper({
    db: unusedDb,
    id: "side-a",
    wsUrl: "ws://127.0.0.1:1/ws",
    ttlMs: 5000,
    heartbeatMs: 1000,
    clock,
    logger: { info: () => undefined, warn: (m) => warnings.push(m) },
    start: async (c) => {
      if (startMs) await new Promise((resolve) => setTimeout(resolve, startMs));
      started.push(c.path);
    },
    stop: async (path) => {
      if (stopMs) await new Promise((resolve) => setTimeout(resolve, stopMs));
      stopped.push(path);
    },
  });
  return { k, started, stopped, warnings };
}

describe("lease keeper", () => {
  beforeEach(() => {
    vi.useFakeTimers();
    rounds = 0;
  });
  afterEach(() => vi.useRealTimers());

  it("keeps renewing while it starts many channels, so a slow takeover never lets its leases lapse", async () => {
    // 200 channels at 400 ms a start: 80 s one after another, far past the 4 s a renewal is good for.
    holding = Array.from({ length: 200 }, (_, i) => channel(i));
    const { k, started, stopped, warnings } = keeper(400);
    k.start();
    await vi.advanceTimersByTimeAsync(20_000);
    expect(started).toHaveLength(200);
    expect(k.owned()).toHaveLength(200);
    expect(stopped).toEqual([]);
    expect(warnings).toEqual([]);
    expect(rounds).toBeGreaterThanOrEqual(19);
    await k.close();
  });

  it("gives up hundreds of channels in one renewal period however slow each unsubscription is", async () => {
    holding = Array.from({ length: 200 }, (_, i) => channel(i));
    const { k, stopped, warnings } = keeper(0, 400);
    await k.round();
    expect(k.owned()).toHaveLength(200);
    k.start();
    holding = holding.slice(0, 50); // 150 go to another sidecar: 60 s of unsubscriptions one after another
    await vi.advanceTimersByTimeAsync(3000);
    expect(stopped).toHaveLength(150);
    expect(k.owned()).toHaveLength(50);
    expect(warnings).toEqual([]);
    const closing = k.close();
    await vi.advanceTimersByTimeAsync(400);
    await closing;
  });

  it("stops a channel whose lease went while it was starting instead of keeping it", async () => {
    holding = [channel(1), channel(2)];
    const { k, stopped } = keeper(2500);
    k.start();
    await vi.advanceTimersByTimeAsync(1500); // first round handed out both; their starts are under way
    holding = [channel(1)];
    await vi.advanceTimersByTimeAsync(5000);
    expect(k.owned()).toEqual(["lab/node/ch-1"]);
    expect(k.owns("lab/node/ch-2")).toBe(false);
    expect(stopped).toEqual(["lab/node/ch-2"]);
    await k.close();
  });

  it("round() resolves once the channels it handed out run", async () => {
    holding = [channel(1), channel(2), channel(3)];
    const { k } = keeper(300);
    const done = k.round();
    await vi.advanceTimersByTimeAsync(300);
    await done;
    expect(k.owned().sort()).toEqual(["lab/node/ch-1", "lab/node/ch-2", "lab/node/ch-3"]);
    await k.close();
  });
});
