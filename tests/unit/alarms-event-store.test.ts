import { describe, expect, it } from "vitest";
import type { AlarmEventRecord } from "@/db/queries/alarm-events";
import { createEventStore } from "@/server/alarms/event-store";
import { tickingClock } from "../support/ticking-clock";

const record = (id: string, over: Partial<AlarmEventRecord> = {}): AlarmEventRecord => ({
  id,
  ruleId: 1,
  kind: "limit",
  severity: "warning",
  signal: "filtered",
  side: "high",
  limit: 240,
  state: "raised",
  raisedAt: 0,
  clearedAt: null,
  peak: 250,
  revisionId: null,
  ...over,
});

/** What PostgreSQL's client reports when the server is gone (node's ECONNREFUSED). */
const down = () => Object.assign(new Error("connect ECONNREFUSED 127.0.0.1:5432"), { code: "ECONNREFUSED" });

function harness(maxBuffered = 100) {
  const clock = tickingClock();
  const stored = new Map<string, AlarmEventRecord>();
  const order: string[] = [];
  const lines: string[] = [];
  const db = { up: true, refuse: new Set<string>() };
  const store = createEventStore({
    clock,
    logger: { info: (m) => lines.push(m), warn: (m) => lines.push(m) },
    maxBuffered,
    retryMs: 1000,
    write: async (records) => {
      if (!db.up) throw down();
      if (records.some((r) => db.refuse.has(r.id))) throw new Error("insert or update on table violates foreign key constraint");
      for (const r of records) {
        stored.set(r.id, r);
        order.push(`${r.id}:${r.state}`);
      }
    },
  });
  const settle = () => new Promise((r) => setTimeout(r, 0));
  return { clock, stored, order, lines, db, store, settle };
}

describe("alarm event store", () => {
  it("writes at once while the database is up", async () => {
    const h = harness();
    h.store.put(record("a"));
    await h.settle();
    expect(h.order).toEqual(["a:raised"]);
    expect(h.store.stats()).toEqual({ buffered: 0, dropped: 0, rejected: 0, written: 1 });
  });

  it("keeps every event through an outage, newest state per event, and writes them in order when it is back", async () => {
    const h = harness();
    h.db.up = false;
    h.store.put(record("a"));
    h.store.put(record("b"));
    h.store.put(record("a", { state: "cleared", clearedAt: 500, peak: 260 }));
    h.store.put(record("c"));
    await h.settle();
    h.clock.advance(3000);
    await h.settle();
    expect(h.store.stats().buffered).toBe(3);
    expect(h.lines.filter((l) => l.includes("not written"))).toHaveLength(1);
    h.db.up = true;
    h.clock.advance(1000);
    await h.settle();
    expect(h.order).toEqual(["a:cleared", "b:raised", "c:raised"]);
    expect(h.stored.get("a")).toMatchObject({ state: "cleared", peak: 260 });
    expect(h.store.stats()).toMatchObject({ buffered: 0, written: 3 });
    expect(h.lines.at(-1)).toMatch(/written again after 4 s/);
  });

  it("past its bound drops the oldest cleared events, never a raised one", async () => {
    const h = harness(3);
    h.db.up = false;
    h.store.put(record("r1"));
    h.store.put(record("c1", { state: "cleared", clearedAt: 1 }));
    h.store.put(record("c2", { state: "cleared", clearedAt: 2 }));
    h.store.put(record("r2"));
    h.store.put(record("r3"));
    h.store.put(record("r4"));
    await h.settle();
    expect(h.store.stats()).toMatchObject({ buffered: 4, dropped: 2 });
    h.db.up = true;
    await h.store.flush();
    expect(h.order).toEqual(["r1:raised", "r2:raised", "r3:raised", "r4:raised"]);
  });

  it("drops an event the database refuses on its own and writes the rest", async () => {
    const h = harness();
    h.db.up = false;
    h.store.put(record("a"));
    h.store.put(record("bad"));
    h.store.put(record("b"));
    h.db.refuse.add("bad");
    h.db.up = true;
    await h.store.flush();
    expect(h.order).toEqual(["a:raised", "b:raised"]);
    expect(h.store.stats()).toMatchObject({ buffered: 0, rejected: 1, written: 2 });
    expect(h.lines.some((l) => l.includes("bad") && l.includes("foreign key"))).toBe(true);
  });
});
