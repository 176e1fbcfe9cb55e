import type { MqttClient } from "mqtt";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Db } from "@/db/client";
import { DEMO_RIGS } from "@/lib/demo/lab";
import { designFilter } from "@/lib/dsp";
import { liveOverviewSchema } from "@/lib/protocol";
import { encodeBinarySamples, samplesTopic, statusTopic } from "@/lib/protocol";
import { systemClock, type Clock } from "@/server/clock";
import type { LiveOverview as Overview } from "@/lib/protocol";
import type { Sidecar } from "@/server/sidecar";
import { connectDevice, seededDb, testSidecar, until } from "./sidecar-support";

const STRAIN = "hydraulic-press/env-node/frame-strain"; // 1 kHz
const AMBIENT = "hydraulic-press/env-node/ambient-temp"; // 100 Hz, same device
const RAM = "hydraulic-press/press-ctl/ram-position"; // another device, never connected here
const STATUS = statusTopic("hydraulic-press", "env-node");

/** The system's timers with a clock the test moves by hand, so lastSampleAt is exact. */
let now = 1_764_633_600_000;
const clock: Clock = { ...systemClock, now: () => now };

let store: { db: Db; close: () => Promise<void> };
let sidecar: Sidecar;
let device: MqttClient;

beforeAll(async () => {
  store = await seededDb("overview_sidecar");
  sidecar = await testSidecar(store.db, { clock });
});

afterAll(async () => {
  await device?.endAsync().catch(() => undefined);
  await sidecar?.close();
  await store?.close();
});

async function overview(): Promise<Overview> {
  const res = await fetch(`http://127.0.0.1:${sidecar.httpPort}/overview`);
  expect(res.status).toBe(200);
  expect(res.headers.get("cache-control")).toBe("no-store");
  return (await res.json()) as Overview;
}

/** Publishes `n` samples of a ramp starting at `start`, 1 kHz, as one binary batch, and waits until ingest has it. */
async function publishRamp(seq: number, t0: number, start: number, n: number): Promise<void> {
  const before = sidecar.ingest.accepted.messages;
  const values = Float64Array.from({ length: n }, (_, i) => start + i);
  await device.publishAsync(samplesTopic(STRAIN), Buffer.from(encodeBinarySamples({ seq, t0, sampleRateHz: 1000, values })));
  await until(() => sidecar.ingest.accepted.messages === before + 1, 5000, "ingest");
}

describe("GET /overview on the sidecar", () => {
  it("knows nothing before any device speaks: online, samples, production and spark are null", async () => {
    const body = await overview();
    expect(body.mqtt).toBe("connected");
    expect(Object.keys(body.channels)).toHaveLength(DEMO_RIGS.flatMap((r) => r.devices.flatMap((d) => d.channels)).length);
    expect(body.channels[STRAIN]).toEqual({ online: null, lastSampleAt: null, productionRevisionId: null, spark: null, faults: {}, faultsSince: expect.any(Number) });
    expect(body.channels[STRAIN].faultsSince).toBeLessThanOrEqual(body.now);
  });

  it("reports the device online from its retained status, and lastSampleAt advancing with each batch", async () => {
    device = await connectDevice(sidecar.mqttUrl, {
      clientId: "env-node-test",
      will: { topic: STATUS, payload: Buffer.from(JSON.stringify({ state: "offline" })), qos: 1, retain: true },
    });
    await device.publishAsync(STATUS, JSON.stringify({ state: "online" }), { qos: 1, retain: true });
    await until(() => sidecar.devices.online("hydraulic-press", "env-node") === true, 5000, "online status");

    now += 1000;
    await publishRamp(0, 1_000, 0, 600);
    const first = await overview();
    expect(first.channels[STRAIN].online).toBe(true);
    expect(first.channels[AMBIENT].online).toBe(true);
    expect(first.channels[RAM].online).toBeNull();
    expect(first.channels[STRAIN].lastSampleAt).toBe(now);
    expect(first.channels[AMBIENT].lastSampleAt).toBeNull();
    expect(first.now).toBe(now);

    now += 250;
    await publishRamp(1, 1_600, 600, 600);
    const second = await overview();
    expect(second.channels[STRAIN].lastSampleAt).toBe(first.channels[STRAIN].lastSampleAt! + 250);
  });

  it("summarises the last samples as whole 500 ms min/max buckets stamped with the device's sample time", async () => {
    // 1200 samples of a ramp 0…1199 at 1 kHz from t0 = 1000 ms: two whole buckets of 500 samples.
    const { spark } = (await overview()).channels[STRAIN];
    expect(spark).toEqual({ t0: 1_000, stepMs: 500, min: [0, 500], max: [499, 999] });
  });

  it("starts the envelope over after a jump in the device's time, so t0 + i·stepMs stays true", async () => {
    await publishRamp(2, 60_000, 5_000, 500);
    expect((await overview()).channels[STRAIN].spark).toEqual({ t0: 60_000, stepMs: 500, min: [5_000], max: [5_499] });
  });

  it("shows the production revision once the slot holds one, and the channel's fault counts", async () => {
    const notch = designFilter({ kind: "biquad", shape: "notch", centerHz: 50, q: 8, sampleRateHz: 1000 });
    sidecar.pipeline.setProductionFilter(STRAIN, "17", notch);
    await publishRamp(9, 60_500, 0, 10); // seq 3 expected: one seq_gap
    const body = await overview();
    expect(body.channels[STRAIN].productionRevisionId).toBe("17");
    expect(body.channels[STRAIN].faults).toEqual({ seq_gap: 1 });
    expect(body.channels[AMBIENT].productionRevisionId).toBeNull();
    expect(liveOverviewSchema.safeParse(body).success).toBe(true);
  });

  it("reports the device offline when its connection drops and the broker publishes its last will", async () => {
    device.stream.destroy();
    await until(() => sidecar.devices.online("hydraulic-press", "env-node") === false, 5000, "last will");
    const body = await overview();
    expect(body.channels[STRAIN].online).toBe(false);
    expect(body.channels[AMBIENT].online).toBe(false);
    expect(body.channels[STRAIN].lastSampleAt).not.toBeNull();
  });

  it("ignores a malformed status and clears the state on an empty retained payload", async () => {
    const other = await connectDevice(sidecar.mqttUrl);
    try {
      await other.publishAsync(STATUS, "{\"state\":\"maybe\"}", { qos: 1, retain: true });
      await other.publishAsync(STATUS, JSON.stringify({ state: "online" }), { qos: 1, retain: true });
      await until(() => sidecar.devices.online("hydraulic-press", "env-node") === true, 5000, "online again");
      await other.publishAsync(STATUS, "", { qos: 1, retain: true });
      await until(() => sidecar.devices.online("hydraulic-press", "env-node") === null, 5000, "cleared status");
    } finally {
      await other.endAsync();
    }
  });

  it("answers 404 for anything else and never carries per-user state", async () => {
    expect((await fetch(`http://127.0.0.1:${sidecar.httpPort}/overview/x`)).status).toBe(404);
    expect((await fetch(`http://127.0.0.1:${sidecar.httpPort}/overview`, { method: "POST" })).status).toBe(404);
    const text = JSON.stringify(await overview());
    expect(text).not.toMatch(/candidate|user|email/i);
  });
});
