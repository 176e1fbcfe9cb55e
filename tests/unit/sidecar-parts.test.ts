import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { findPeaks, welch } from "@/lib/dsp";
import { backoffDelay } from "@/server/broker/mqtt-bus";
import { topicFilter } from "@/server/broker/bus";
import { systemClock, type Clock } from "@/server/clock";
import { createSignalSource } from "@/server/demo-rig/signals";
import { RECIPES } from "@/server/demo-rig/recipes";
import { mulberry32 } from "@/server/demo-rig/prng";
import { createFaultLog } from "@/server/ingest/fault-log";
import { buildFrames } from "@/server/ws/frames";

/** The process clock with a time that only moves when the test says so. */
function manualClock(start = 0): Clock & { advance(ms: number): void } {
  let now = start;
  return { ...systemClock, now: () => now, advance: (ms) => void (now += ms) };
}

describe("sidecar parts", () => {
  it("backoff grows exponentially to its cap, scaled by the jitter draw", () => {
    expect([0, 1, 2, 3, 10].map((a) => backoffDelay(a, 250, 10_000, () => 0.999999))).toEqual([250, 500, 1000, 2000, 10_000]);
    expect(backoffDelay(5, 250, 10_000, () => 0)).toBe(0);
    expect(backoffDelay(2, 250, 10_000, () => 0.5)).toBe(500);
  });

  it("logs each fault kind at most once per interval and still counts every one", () => {
    const clock = manualClock();
    const lines: string[] = [];
    const faults = createFaultLog({ clock, logger: { info: () => undefined, warn: (m) => lines.push(m) }, logEveryMs: 60_000 });
    for (let i = 0; i < 500; i++) faults.record("a/b/c", "bad_json");
    faults.record("a/b/c", "seq_gap");
    expect(lines).toHaveLength(2);
    clock.advance(60_000);
    faults.record("x/y/z", "bad_json");
    expect(lines).toHaveLength(3);
    expect(lines[2]).toMatch(/499 more/);
    expect(faults.totals()).toEqual({ bad_json: 501, seq_gap: 1 });
    expect(faults.byChannel()["a/b/c"]).toEqual({ bad_json: 500, seq_gap: 1 });
  });

  it("matches MQTT wildcards and strips a shared-subscription prefix", () => {
    expect(topicFilter("tapwright/v1/+/+/+/samples")("tapwright/v1/a/b/c/samples")).toBe(true);
    expect(topicFilter("$share/g/tapwright/v1/+/+/+/samples")("tapwright/v1/a/b/c/samples")).toBe(true);
    expect(topicFilter("tapwright/v1/+/+/+/samples")("tapwright/v1/a/b/samples")).toBe(false);
    expect(topicFilter("tapwright/#")("tapwright/v1/a")).toBe(true);
  });

  // OASIS, MQTT Version 3.1.1 (2014), §4.7.1.2 and §4.7.1.3: the standard's own examples.
  it.each([
    ["sport/tennis/player1/#", "sport/tennis/player1", true],
    ["sport/tennis/player1/#", "sport/tennis/player1/ranking", true],
    ["sport/tennis/player1/#", "sport/tennis/player1/score/wimbledon", true],
    ["sport/#", "sport", true],
    ["sport/tennis/+", "sport/tennis/player1", true],
    ["sport/tennis/+", "sport/tennis/player1/ranking", false],
    ["sport/+", "sport", false],
    ["sport/+", "sport/", true],
    ["+/+", "/finance", true],
    ["/+", "/finance", true],
    ["+", "/finance", false],
  ])("filter %s on topic %s: %s", (filter, topic, expected) => {
    expect(topicFilter(filter)(topic)).toBe(expected);
  });

  it("matches as the level-by-level reading of the standard does, on random filters and topics", () => {
    /** §4.7 read literally: split both into levels and compare them in turn. */
    const byLevels = (filter: string, topic: string) => {
      const f = filter.split("/");
      const t = topic.split("/");
      for (let i = 0; i < f.length; i++) {
        if (f[i] === "#") return true;
        if (i >= t.length) return false;
        if (f[i] !== "+" && f[i] !== t[i]) return false;
      }
      return f.length === t.length;
    };
    const level = fc.constantFrom("", "a", "b", "ab");
    const filterLevels = fc.array(fc.constantFrom("", "a", "b", "ab", "+"), { minLength: 1, maxLength: 5 });
    const filters = fc.tuple(filterLevels, fc.boolean()).map(([levels, hash]) => [...levels, ...(hash ? ["#"] : [])].join("/"));
    const topics = fc.array(level, { minLength: 1, maxLength: 6 }).map((levels) => levels.join("/"));
    fc.assert(fc.property(filters, topics, (filter, topic) => topicFilter(filter)(topic) === byLevels(filter, topic)), { numRuns: 5000, seed: 20261204 });
  });

  const f64 = (...values: number[]) => Float64Array.from(values);

  it("frames leave out a trace that is not finite", () => {
    const view = { path: "a/b/c", sampleRateHz: 100, traceIds: new Map([["production", "production"], ["o/x", "x"]]), bucket: 1, carry: null };
    const block = { seq: 4, lastSeq: 5, t0: 10, raw: f64(1, 2), traces: new Map([["production", f64(1, 2)], ["o/x", f64(1, Number.NaN)]]) };
    const [frame] = buildFrames(view, [block]);
    expect(Object.keys(frame.traces)).toEqual(["production"]);
    expect(Array.from(frame.traces.production)).toEqual([1, 2]);
    expect(frame).toMatchObject({ seq: 5, t0: 10, samples: 2, decimated: false });
  });

  it("decimated frames pick up a production filter switched in while a remainder is carried", () => {
    const view = { path: "a/b/c", sampleRateHz: 100, traceIds: new Map([["production", "production"]]), bucket: 4, carry: null };
    const before = { seq: 1, lastSeq: 1, t0: 0, raw: f64(1, 2, 3, 4, 5, 6), traces: new Map<string, Float64Array>() };
    const after = { seq: 2, lastSeq: 3, t0: 60, raw: f64(7, 8, 9, 10, 11, 12, 13, 14), traces: new Map([["production", f64(7, 8, 9, 10, 11, 12, 13, 14)]]) };
    const first = buildFrames(view, [before]);
    expect(first.map((f) => f.samples)).toEqual([4]); // two samples carried
    const next = buildFrames(view, [after]);
    // The carried samples had no production output, so they go out as a short bucket of their own.
    expect(next.map((f) => [f.samples, Object.keys(f.traces)])).toEqual([[2, []], [8, ["production"]]]);
    expect(next[1].traces.production).toEqual([7, 10, 11, 14]);
    expect(buildFrames(view, [{ ...after, seq: 4, lastSeq: 4, t0: 140, raw: f64(15, 16), traces: new Map([["production", f64(15, 16)]]) }])).toEqual([]); // carried on
  });

  it("mulberry32 is deterministic and the demo streams repeat from the same seed", () => {
    const a = mulberry32(1);
    const b = mulberry32(1);
    expect(Array.from({ length: 5 }, a)).toEqual(Array.from({ length: 5 }, b));
    const recipe = RECIPES["hydraulic-press/env-node/frame-strain"];
    const s1 = createSignalSource(recipe, 1000, 99);
    const s2 = createSignalSource(recipe, 1000, 99);
    expect(Array.from(s1.next(500))).toEqual(Array.from(s2.next(500)));
    expect(Array.from(createSignalSource(recipe, 1000, 100).next(10))).not.toEqual(Array.from(s1.next(10)));
  });

  it("the demo strain channel carries its 50 Hz hum and the housing its resonance near 1.2 kHz", () => {
    const strain = createSignalSource(RECIPES["hydraulic-press/env-node/frame-strain"], 1000, 5).next(4000);
    const s = welch(strain, 1000, { segmentLength: 1000 });
    expect(findPeaks(s.freqsHz, s.psd, { count: 1 })[0].freqHz).toBeCloseTo(50, 0);
    const accel = createSignalSource(RECIPES["gearbox-endurance/vibe-node/housing-accel"], 5000, 5).next(20_000);
    const a = welch(accel, 5000, { segmentLength: 1000 });
    const band = (lo: number, hi: number) => a.psd.filter((_, k) => a.freqsHz[k] >= lo && a.freqsHz[k] <= hi).reduce((x, y) => x + y, 0);
    expect(band(1100, 1300)).toBeGreaterThan(5 * band(1900, 2100));
  });
});
