import { describe, expect, it } from "vitest";
import { reconnectDelayMs } from "@/lib/bench/backoff";
import { FIRST_CANDIDATE_SLOT, LiveStore, PRODUCTION_SLOT, RAW_SLOT } from "@/lib/bench/live-store";
import { TraceRing } from "@/lib/bench/ring-buffer";
import type { FrameMessage } from "@/lib/protocol";

const column = (ring: TraceRing, s: number) => Array.from({ length: ring.length }, (_, i) => ring.y(s, i));
const times = (ring: TraceRing) => Array.from({ length: ring.length }, (_, i) => ring.x(i));

describe("TraceRing", () => {
  it("keeps the newest rows in order once it wraps around", () => {
    const ring = new TraceRing(4, 1);
    ring.pushBlock(0, 1, 3, [[10, 11, 12]]);
    ring.pushBlock(3, 1, 3, [[13, 14, 15]]);
    expect(ring.length).toBe(4);
    expect(times(ring)).toEqual([2, 3, 4, 5]);
    expect(column(ring, 0)).toEqual([12, 13, 14, 15]);
  });

  it("writes NaN for a missing column and finds times by binary search", () => {
    const ring = new TraceRing(8, 2);
    ring.pushBlock(1, 0.5, 4, [[1, 2, 3, 4]]);
    expect(column(ring, 1).every(Number.isNaN)).toBe(true);
    expect(ring.lowerBound(1.6)).toBe(2);
    expect(ring.lowerBound(0)).toBe(0);
    expect(ring.lowerBound(99)).toBe(4);
    expect(ring.lastX()).toBe(2.5);
  });

  it("forgets one series or everything", () => {
    const ring = new TraceRing(4, 2);
    ring.pushBlock(0, 1, 2, [[1, 2], [3, 4]]);
    ring.clearSeries(1);
    expect(column(ring, 0)).toEqual([1, 2]);
    expect(column(ring, 1).every(Number.isNaN)).toBe(true);
    ring.clear();
    expect(ring.length).toBe(0);
    expect(ring.lastX()).toBeNaN();
  });

  it("refuses a capacity below 2", () => {
    expect(() => new TraceRing(1, 1)).toThrow(/capacity must be an integer ≥ 2/);
  });
});

function frame(t0: number, raw: number[], traces: Record<string, number[]> = {}): FrameMessage<number[]> {
  return { type: "frame", channel: "a/b/c", seq: 1, t0, sampleRateHz: 1000, raw, traces, samples: raw.length, decimated: false };
}

describe("LiveStore", () => {
  it("routes raw, production and bound candidates to their slots and reports the latest values", () => {
    const store = new LiveStore(1000, 1);
    store.bind("cand-1", FIRST_CANDIDATE_SLOT + 2);
    store.push(frame(1000, [1, 2, 3], { production: [4, 5, 6], "cand-1": [7, 8, 9], other: [0, 0, 0] }));
    expect(store.latest()[RAW_SLOT]).toBe(3);
    expect(store.latest()[PRODUCTION_SLOT]).toBe(6);
    expect(store.latest()[FIRST_CANDIDATE_SLOT + 2]).toBe(9);
    expect(store.latest()[FIRST_CANDIDATE_SLOT]).toBeNull();
    expect(times(store.ring)).toEqual([1, 1.001, 1.002]);
  });

  it("leaves a gap (NaN row) when samples are missing and restarts when time goes back", () => {
    const store = new LiveStore(1000, 1);
    store.push(frame(0, [1, 2]));
    store.push(frame(10, [3]));
    expect(column(store.ring, RAW_SLOT)).toEqual([1, 2, NaN, 3]);
    store.push(frame(5, [9]));
    expect(column(store.ring, RAW_SLOT)).toEqual([9]);
  });

  it("gives the recent finite samples of a slot, gaps left out", () => {
    const store = new LiveStore(1000, 1);
    store.push(frame(0, [1, 2]));
    store.push(frame(10, [3, 4, 5]));
    expect(Array.from(store.recent(RAW_SLOT, 1))).toEqual([1, 2, 3, 4, 5]);
    expect(Array.from(store.recent(RAW_SLOT, 0.0015))).toEqual([4, 5]);
  });

  it("tells listeners of frames and of a candidate's removal", () => {
    const store = new LiveStore(1000, 1);
    let heard = 0;
    const stop = store.subscribe(() => heard++);
    store.bind("x", FIRST_CANDIDATE_SLOT);
    store.push(frame(0, [1], { x: [2] }));
    store.unbind("x");
    expect(heard).toBe(2);
    expect(store.latest()[FIRST_CANDIDATE_SLOT]).toBeNull();
    stop();
    store.push(frame(1, [1]));
    expect(heard).toBe(2);
  });
});

describe("reconnect backoff", () => {
  it("doubles from 0.5 s up to 15 s, spread by ±20 %", () => {
    expect([0, 1, 2, 3, 10].map((a) => reconnectDelayMs(a, 0.5))).toEqual([500, 1000, 2000, 4000, 15000]);
    expect(reconnectDelayMs(0, 0)).toBe(400);
    expect(reconnectDelayMs(0, 0.999999)).toBe(600);
  });
});
