import { describe, expect, it } from "vitest";
import { liveDesign, type FilterSpec } from "@/lib/dsp";
import type { ControlMessage } from "@/lib/protocol";
import type { Clock, Timer } from "@/server/clock";
import { createFaultLog } from "@/server/ingest/fault-log";
import { createPipeline } from "@/server/pipeline/pipeline";
import { createHub, type ClientConn } from "@/server/ws/hub";

const FS = 1000;
const CHANNELS = Array.from({ length: 10 }, (_, i) => ({ path: `lab/node/ch-${i}`, sampleRateHz: FS }));
const SPECS: FilterSpec[] = [
  { kind: "moving-average", length: 4, sampleRateHz: FS },
  { kind: "biquad", shape: "notch", centerHz: 50, q: 5, sampleRateHz: FS },
];
const FRAME_MS = 100;

/** A hub on a hand-driven clock (its timers never fire: the test calls its ticks itself), one engineer with two candidates on each of ten channels. */
async function engineerWithCandidates(metricsPerSecond?: number, queuedBytes = 0) {
  let now = 0;
  const quiet = { info: () => undefined, warn: () => undefined };
  const clock: Clock = {
    now: () => now,
    setInterval: () => setTimeout(() => undefined, 0),
    clearInterval: (t: Timer) => clearTimeout(t),
    setTimeout: (fn, ms) => setTimeout(fn, ms),
    clearTimeout: (t) => clearTimeout(t),
  };
  const pipeline = createPipeline({ channels: CHANNELS, now: clock.now });
  const hub = createHub({
    pipeline,
    faults: createFaultLog({ clock, logger: quiet }),
    clock,
    logger: quiet,
    busState: () => "connected",
    sessions: async () => [],
    design: async (spec) => liveDesign(spec),
    messageRate: { perSecond: 1e6, burst: 1e6 },
    frameIntervalMs: FRAME_MS,
    metricsIntervalMs: 1000,
    metricsPerSecond,
  });
  const perChannel = new Map<string, number>();
  const sent = { binaryMessages: 0, bytes: 0 };
  const conn: ClientConn = {
    id: "c1",
    user: { id: 1, email: "engineer@tapwright.test", name: "Engineer", role: "engineer" },
    session: { userId: 1, sessionVersion: 1, sessionId: "s" },
    send(data) {
      if (typeof data !== "string") {
        sent.binaryMessages++;
        sent.bytes = data.byteLength;
        return;
      }
      const m = JSON.parse(data) as ControlMessage;
      if (m.type === "metrics") perChannel.set(m.channel, (perChannel.get(m.channel) ?? 0) + 1);
      if (m.type === "error") throw new Error(`the hub refused a message: ${m.message}`);
    },
    close: () => undefined,
    bufferedAmount: () => queuedBytes,
  };
  hub.add(conn);
  for (const { path } of CHANNELS) {
    hub.message(conn.id, JSON.stringify({ type: "subscribe", channel: path }));
    SPECS.forEach((spec, i) => hub.message(conn.id, JSON.stringify({ type: "candidate.add", channel: path, id: `k${i}`, spec })));
  }
  await new Promise((r) => setTimeout(r, 0)); // the designs resolve
  const run = (seconds: number) => {
    for (let t = 0; t < (seconds * 1000) / FRAME_MS; t++) {
      hub.metricsTick();
      now += FRAME_MS;
    }
  };
  /** One frame tick after `samples` new samples on every channel; the status the client would get next. */
  const frameTick = (samples: number) => {
    for (const [seq, { path }] of CHANNELS.entries()) pipeline.push(path, { seq, t0: 0, sampleRateHz: FS, values: new Float64Array(samples).fill(1) });
    hub.tick();
  };
  const dropped = () => {
    let count = -1;
    conn.send = (data) => {
      if (typeof data === "string") {
        const m = JSON.parse(data) as ControlMessage;
        if (m.type === "status") count = m.droppedFrames;
      }
    };
    hub.statusTick();
    return count;
  };
  return { perChannel, run, frameTick, sent, dropped };
}

describe("the hub's live metrics budget", () => {
  it("refreshes each channel's metrics once per interval while the budget covers every candidate", async () => {
    const { perChannel, run } = await engineerWithCandidates();
    run(3);
    expect([...perChannel.keys()].sort()).toEqual(CHANNELS.map((c) => c.path).sort());
    for (const count of perChannel.values()) expect(count).toBe(3);
  });

  it("computes no more candidates per second than the budget, and serves every channel in turn", async () => {
    // 20 candidates, 4 per second: each channel (2 candidates) is refreshed every 5 s.
    const { perChannel, run } = await engineerWithCandidates(4);
    run(10);
    const total = [...perChannel.values()].reduce((a, b) => a + b, 0);
    expect(total * SPECS.length).toBeLessThanOrEqual(4 * 10 + SPECS.length);
    expect(perChannel.size).toBe(CHANNELS.length);
    for (const count of perChannel.values()) expect(count).toBeGreaterThanOrEqual(1);
    expect(Math.max(...perChannel.values()) - Math.min(...perChannel.values())).toBeLessThanOrEqual(1);
  });
});

describe("the hub's frames to a client", () => {
  it("go out as one binary message per tick, all channels together", async () => {
    const { frameTick, sent } = await engineerWithCandidates();
    frameTick(40);
    expect(sent.binaryMessages).toBe(1);
  });

  it("are dropped while more than 1 MiB is queued for a client with a small stream", async () => {
    const { frameTick, sent, dropped } = await engineerWithCandidates(undefined, (1 << 20) + 1);
    frameTick(40); // 10 channels × 3 columns × 40 float32 values: a few kilobytes a tick
    expect(sent.binaryMessages).toBe(0);
    expect(dropped()).toBe(CHANNELS.length);
  });

  it("may queue eight ticks of its own stream when that is more than 1 MiB", async () => {
    // 10 channels × 3 columns × 20,000 values × 4 bytes ≈ 2.4 MB a tick: 2 MiB queued is less than eight ticks of it.
    const { frameTick, sent, dropped } = await engineerWithCandidates(undefined, 2 << 20);
    frameTick(20_000);
    expect(sent.binaryMessages).toBe(1);
    expect(sent.bytes).toBeGreaterThan(2_400_000);
    expect(dropped()).toBe(0);
  });
});
