import fc from "fast-check";
import type { MqttClient } from "mqtt";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Db } from "@/db/client";
import { encodeBinarySamples, MAX_PAYLOAD_BYTES, SAMPLES_FILTER, samplesTopic, TOPIC_ROOT } from "@/lib/protocol";
import { topicFilter } from "@/server/broker/bus";
import type { Sidecar } from "@/server/sidecar";
import { connectDevice, seededDb, testSidecar, until } from "./sidecar-support";

const STRAIN = "hydraulic-press/env-node/frame-strain"; // 1 kHz

/** Payloads that are wrong in every way ingest distinguishes, each paired with a topic. */
const malformed = fc.oneof(
  fc.record({ topic: fc.constant(samplesTopic(STRAIN)), payload: fc.string({ maxLength: 200 }).map((s) => Buffer.from(s)) }),
  fc.record({ topic: fc.constant(samplesTopic(STRAIN)), payload: fc.uint8Array({ maxLength: 300 }).map((b) => Buffer.from(b)) }),
  fc.record({
    topic: fc.constant(samplesTopic(STRAIN)),
    payload: fc
      .record({
        seq: fc.oneof(fc.integer({ min: -5, max: -1 }), fc.double(), fc.string(), fc.constant(null)),
        t0: fc.oneof(fc.double(), fc.string()),
        sampleRateHz: fc.oneof(fc.double(), fc.constant(0), fc.constant(-1000)),
        values: fc.oneof(fc.constant([]), fc.array(fc.oneof(fc.string(), fc.constant(null), fc.boolean()), { minLength: 1, maxLength: 5 })),
      })
      .map((o) => Buffer.from(JSON.stringify(o))),
  }),
  fc.record({
    topic: fc.constant(samplesTopic(STRAIN)),
    payload: fc.integer({ min: 1, max: 40 }).map((n) => Buffer.from(`{"seq":1,"t0":0,"sampleRateHz":1000,"values":[${"1e999,".repeat(n)}1]}`)),
  }),
  fc.record({
    topic: fc.constant(samplesTopic(STRAIN)),
    payload: fc
      .record({ seq: fc.nat(), sampleRateHz: fc.constantFrom(999, 2000, 48000), n: fc.integer({ min: 1, max: 20 }) })
      .map(({ seq, sampleRateHz, n }) => Buffer.from(encodeBinarySamples({ seq, t0: 0, sampleRateHz, values: new Float64Array(n) }))),
  }),
  fc.record({
    topic: fc.constant(samplesTopic(STRAIN)),
    payload: fc.integer({ min: 1, max: 50 }).map((n) => {
      const b = Buffer.from(encodeBinarySamples({ seq: 1, t0: 0, sampleRateHz: 1000, values: new Float64Array(n) }));
      return b.subarray(0, b.length - 1 - (n % 3));
    }),
  }),
  fc.record({
    topic: fc.constant(samplesTopic(STRAIN)),
    payload: fc.integer({ min: 1, max: 30 }).map((n) => {
      const b = Buffer.from(encodeBinarySamples({ seq: 1, t0: 0, sampleRateHz: 1000, values: new Float64Array(n).fill(1) }));
      b.writeFloatLE(Number.NaN, 28 + 4 * (n - 1));
      return b;
    }),
  }),
  fc.record({
    topic: fc.constantFrom(samplesTopic("nope/nope/nope"), `${TOPIC_ROOT}/Bad Key/x/y/samples`, `${TOPIC_ROOT}/a/b/samples`),
    payload: fc.constant(Buffer.from(JSON.stringify({ seq: 0, t0: 0, sampleRateHz: 1000, values: [1] }))),
  }),
  fc.record({ topic: fc.constant(samplesTopic(STRAIN)), payload: fc.constant(Buffer.alloc(MAX_PAYLOAD_BYTES + 1, 0x7b)) }),
);

let store: { db: Db; close: () => Promise<void> };
let sidecar: Sidecar;
let device: MqttClient;

beforeAll(async () => {
  store = await seededDb("sidecar_faults");
  sidecar = await testSidecar(store.db);
  device = await connectDevice(sidecar.mqttUrl);
});

afterAll(async () => {
  await device?.endAsync();
  await sidecar?.close();
  await store?.close();
});

describe("malformed payloads", () => {
  it("1200 random malformed messages are counted by kind and the sidecar keeps serving", async () => {
    const samples = fc.sample(malformed, { numRuns: 1200, seed: 20261201 });
    for (const { topic, payload } of samples) device.publish(topic, payload);
    await device.publishAsync(samplesTopic(STRAIN), JSON.stringify({ seq: 0, t0: 0, sampleRateHz: 1000, values: [1, 2] }));
    await until(() => sidecar.ingest.accepted.messages >= 1, 10_000, "the good message after the flood");
    // Topics outside the samples filter never reach the sidecar; every other message is a counted fault.
    const routed = samples.map((s) => s.topic).filter(topicFilter(SAMPLES_FILTER)).length;
    const counted = () => Object.values(sidecar.faults.totals()).reduce((a, b) => a + (b ?? 0), 0);
    await until(() => counted() === routed, 10_000, "every fault counted");

    const totals = sidecar.faults.totals();
    for (const kind of ["bad_json", "bad_shape", "non_finite", "bad_length", "unknown_channel", "rate_mismatch", "oversized", "bad_topic"] as const) {
      expect(totals[kind], kind).toBeGreaterThan(0);
    }
    expect(totals.handler_error ?? 0).toBe(0);
    const response = await fetch(`http://127.0.0.1:${sidecar.httpPort}/health`);
    const health = (await response.json()) as { status: string; faults: Record<string, number>; faultsByChannel: Record<string, unknown> };
    expect(health.status).toBe("ok");
    expect(health.faults.bad_json).toBe(totals.bad_json);
    expect(health.faultsByChannel[STRAIN]).toBeDefined();
  });

  it("counts a sequence gap and keeps the batch", async () => {
    const before = sidecar.ingest.accepted.messages;
    const gapsBefore = sidecar.faults.totals().seq_gap ?? 0;
    await device.publishAsync(samplesTopic(STRAIN), JSON.stringify({ seq: 1, t0: 2, sampleRateHz: 1000, values: [1] }));
    await device.publishAsync(samplesTopic(STRAIN), JSON.stringify({ seq: 5, t0: 6, sampleRateHz: 1000, values: [1] }));
    await until(() => sidecar.ingest.accepted.messages === before + 2, 5000, "both messages");
    expect(sidecar.faults.totals().seq_gap).toBe(gapsBefore + 1);
  });
});
