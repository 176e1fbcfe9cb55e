import type { MqttClient } from "mqtt";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Db } from "@/db/client";
import { designFilter, filterSignal, type FilterSpec } from "@/lib/dsp";
import { encodeBinarySamples, samplesTopic, type FrameMessage } from "@/lib/protocol";
import { mulberry32 } from "@/server/demo-rig/prng";
import type { Sidecar } from "@/server/sidecar";
import { connectDevice, cookieFor, openSocket, seededDb, testSidecar, until, type TestSocket } from "./sidecar-support";

const STRAIN = "hydraulic-press/env-node/frame-strain"; // 1 kHz
const RAM = "hydraulic-press/press-ctl/ram-position"; // 2 kHz

function signal(n: number, fs: number, seed: number): Float64Array {
  const rnd = mulberry32(seed);
  return Float64Array.from({ length: n }, (_, i) => 300 + 35 * Math.sin((2 * Math.PI * 50 * i) / fs) + 6 * (rnd() - 0.5));
}

let store: { db: Db; close: () => Promise<void> };
let sidecar: Sidecar;
let device: MqttClient;
let socket: TestSocket;

beforeAll(async () => {
  store = await seededDb("sidecar_stream");
  sidecar = await testSidecar(store.db);
  device = await connectDevice(sidecar.mqttUrl);
  socket = await openSocket(sidecar.httpPort, await cookieFor(store.db, "engineer@tapwright.test"));
  await socket.next("hello");
});

afterAll(async () => {
  socket?.ws.close();
  await device?.endAsync();
  await sidecar?.close();
  await store?.close();
});

/** Sends a message the server refuses, so its reply proves every earlier message was handled. */
async function barrier(): Promise<void> {
  socket.send({ type: "subscribe", channel: "no-such/rig/channel" });
  await socket.next("error", (m) => m.code === "unknown_channel");
}

async function publishAndTick(path: string, payloads: Array<string | Uint8Array>): Promise<void> {
  const before = sidecar.ingest.accepted.messages;
  for (const p of payloads) await device.publishAsync(samplesTopic(path), Buffer.from(p));
  await until(() => sidecar.ingest.accepted.messages === before + payloads.length, 5000, "ingest");
  sidecar.hub.tick();
}

const asFloat32 = (values: ArrayLike<number>): number[] => Array.from(values, Math.fround);

function framesFor(path: string, from: number): FrameMessage[] {
  return socket.messages.slice(from).filter((m): m is FrameMessage => m.type === "frame" && m.channel === path);
}

describe("live stream end to end (device → embedded broker → pipeline → WebSocket)", () => {
  it("frames carry candidate and production traces equal to filterSignal on the same samples", async () => {
    const candidate: FilterSpec = { kind: "iir", family: "butterworth", response: "lowpass", order: 4, cutoffHz: 40, sampleRateHz: 1000 };
    const notch = designFilter({ kind: "biquad", shape: "notch", centerHz: 50, q: 8, sampleRateHz: 1000 });
    sidecar.pipeline.setProductionFilter(STRAIN, "rev-1", notch);
    socket.send({ type: "subscribe", channel: STRAIN });
    socket.send({ type: "candidate.add", channel: STRAIN, id: "lp", spec: candidate });
    await barrier();

    const x = signal(600, 1000, 7);
    const payloads = Array.from({ length: 12 }, (_, k) =>
      JSON.stringify({ seq: k, t0: 1_700_000_000_000 + k * 50, sampleRateHz: 1000, values: Array.from(x.subarray(k * 50, k * 50 + 50)) }),
    );
    const mark = socket.messages.length;
    await publishAndTick(STRAIN, payloads);
    await until(() => framesFor(STRAIN, mark).length > 0, 5000, "a frame");

    // Frames carry float32 columns (protocol 2): each value is the float32 rounding of the sidecar's float64 result.
    const [frame] = framesFor(STRAIN, mark);
    expect(Array.from(frame.raw)).toEqual(asFloat32(x));
    expect(frame.decimated).toBe(false);
    expect(frame.t0).toBe(1_700_000_000_000);
    expect(frame.seq).toBe(11);
    expect(Array.from(frame.traces.lp)).toEqual(asFloat32(filterSignal(designFilter(candidate), x, { initial: "step" })));
    expect(Array.from(frame.traces.production)).toEqual(asFloat32(filterSignal(notch, x, { initial: "step" })));
  });

  it("binary payloads are filtered like their float32 values", async () => {
    const spec: FilterSpec = { kind: "biquad", shape: "lowpass", centerHz: 200, q: 0.707, sampleRateHz: 2000 };
    socket.send({ type: "subscribe", channel: RAM });
    socket.send({ type: "candidate.add", channel: RAM, id: "b1", spec });
    await barrier();
    const x = signal(400, 2000, 11);
    const payloads = [0, 1, 2, 3].map((k) => encodeBinarySamples({ seq: k, t0: 5000 + k * 50, sampleRateHz: 2000, values: x.subarray(k * 100, k * 100 + 100) }));
    const mark = socket.messages.length;
    await publishAndTick(RAM, payloads);
    await until(() => framesFor(RAM, mark).length > 0, 5000, "a frame");
    const stored = Float64Array.from(new Float32Array(x));
    const [frame] = framesFor(RAM, mark);
    expect(Array.from(frame.raw)).toEqual(Array.from(stored));
    expect(Array.from(frame.traces.b1)).toEqual(asFloat32(filterSignal(designFilter(spec), stored, { initial: "step" })));
  });

  it("a window wider than maxPoints decimates with min/max buckets that keep every extreme", async () => {
    socket.send({ type: "window", channel: STRAIN, seconds: 10, maxPoints: 100 }); // 10 000 samples → buckets of 200
    await barrier();
    const x = signal(1100, 1000, 3);
    x[137] = 5000; // a spike in bucket 0
    x[642] = -5000; // a dip in bucket 3
    const payloads = Array.from({ length: 11 }, (_, k) =>
      JSON.stringify({ seq: 100 + k, t0: 9000 + k * 100, sampleRateHz: 1000, values: Array.from(x.subarray(k * 100, k * 100 + 100)) }),
    );
    const mark = socket.messages.length;
    await publishAndTick(STRAIN, payloads);
    await until(() => framesFor(STRAIN, mark).length > 0, 5000, "a frame");
    const [frame] = framesFor(STRAIN, mark);
    expect(frame.decimated).toBe(true);
    expect(frame.bucketSamples).toBe(200);
    expect(frame.samples).toBe(1000); // 100 samples wait for the next bucket
    expect(frame.raw).toHaveLength(10);
    for (let b = 0; b < 5; b++) {
      const slice = Array.from(x.subarray(b * 200, b * 200 + 200));
      const lo = slice.indexOf(Math.min(...slice));
      const hi = slice.indexOf(Math.max(...slice));
      expect(Array.from(frame.raw.slice(2 * b, 2 * b + 2))).toEqual(asFloat32(lo < hi ? [slice[lo], slice[hi]] : [slice[hi], slice[lo]]));
    }
    expect(Math.max(...frame.raw)).toBe(5000);
    expect(Math.min(...frame.raw)).toBe(-5000);
    expect(frame.traces.lp).toHaveLength(10);

    const y = signal(100, 1000, 4);
    const mark2 = socket.messages.length;
    await publishAndTick(STRAIN, [JSON.stringify({ seq: 111, t0: 10_100, sampleRateHz: 1000, values: Array.from(y) })]);
    await until(() => framesFor(STRAIN, mark2).length > 0, 5000, "the carried bucket");
    const [carried] = framesFor(STRAIN, mark2);
    expect(carried.t0).toBe(10_000);
    expect(carried.samples).toBe(200);
  });
});
