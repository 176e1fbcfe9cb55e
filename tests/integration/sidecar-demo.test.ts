import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Db } from "@/db/client";
import { DEMO_RIGS } from "@/lib/demo/lab";
import { deviceConfigSchema, type UnsignedDeviceConfig } from "@/lib/protocol";
import { signConfig } from "@/server/devices/checksum";
import type { Sidecar } from "@/server/sidecar";
import { humChain } from "../unit/coefficients-support";
import { cookieFor, openSocket, seededDb, testSidecar, until } from "./sidecar-support";

let store: { db: Db; close: () => Promise<void> };
let sidecar: Sidecar;

beforeAll(async () => {
  store = await seededDb("sidecar_demo");
  sidecar = await testSidecar(store.db, {
    mqtt: { mode: "embedded", host: "127.0.0.1", port: 0, requireDeviceAuth: true },
    demo: { seed: 42 },
    timers: true,
  });
});

afterAll(async () => {
  await sidecar?.close();
  await store?.close();
});

const unsigned: UnsignedDeviceConfig = {
  v: 3,
  device: "gearbox-endurance/torque-node",
  configId: "rev-42",
  channels: {
    "input-torque": {
      revisionId: "rev-42",
      format: "q15",
      sampleRateHz: 1000,
      stages: [
        { kind: "sections", sections: [{ words: [1024, 2048, 1024, -20000, 9000], shift: 1 }] },
        { kind: "fir", taps: { words: [8192, 16384, 8192], shift: 0 } },
      ],
    },
    "shaft-speed": null,
  },
};

describe("demo rig (authenticated like a device) and the config exchange", () => {
  it("streams every demo channel without faults through the authenticated broker", async () => {
    const paths = DEMO_RIGS.flatMap((r) => r.devices.flatMap((d) => d.channels.map((c) => `${r.key}/${d.key}/${c.key}`)));
    await until(() => sidecar.ingest.accepted.messages > 200, 10_000, "demo samples");
    const faults = sidecar.faults.totals();
    expect(Object.keys(faults).filter((k) => k !== "seq_gap")).toEqual([]);
    const browser = await openSocket(sidecar.httpPort, await cookieFor(store.db, "operator@tapwright.test"));
    for (const channel of paths) browser.send({ type: "subscribe", channel });
    for (const channel of paths) expect((await browser.next("frame", (f) => f.channel === channel)).raw.length).toBeGreaterThan(0);
    browser.ws.close();
  });

  it("reports live metrics of a candidate about once a second", async () => {
    const engineer = await openSocket(sidecar.httpPort, await cookieFor(store.db, "engineer@tapwright.test"));
    const channel = "hydraulic-press/env-node/frame-strain"; // 50 Hz hum of 35 µε, 1 kHz
    engineer.send({ type: "subscribe", channel });
    engineer.send({ type: "candidate.add", channel, id: "notch", spec: { kind: "biquad", shape: "notch", centerHz: 50, q: 2, sampleRateHz: 1000 } });
    const metrics = await engineer.next("metrics", (m) => m.candidates.notch?.noiseLineHz !== null && m.candidates.notch?.noiseLineHz !== undefined);
    const m = metrics.candidates.notch;
    expect(m.noiseLineHz).toBeCloseTo(50, 0);
    expect(m.predictedAttenuationDb).toBeGreaterThan(40);
    expect(m.measuredAttenuationDb).toBeGreaterThan(15);
    expect(m.removedRms).toBeGreaterThan(15); // the hum's RMS is 35/√2 ≈ 25 µε
    expect(m.lagMs).toBeGreaterThanOrEqual(0);
    engineer.ws.close();
  }, 15_000);

  it("judges the live metrics at the noise line the engineer chose, within 0 < f < fs/2, engineers only", async () => {
    const engineer = await openSocket(sidecar.httpPort, await cookieFor(store.db, "engineer@tapwright.test"));
    const channel = "hydraulic-press/env-node/frame-strain"; // 1 kHz
    engineer.send({ type: "subscribe", channel });
    engineer.send({ type: "candidate.add", channel, id: "notch", spec: { kind: "biquad", shape: "notch", centerHz: 50, q: 2, sampleRateHz: 1000 } });
    engineer.send({ type: "noise-line", channel, freqHz: 120 });
    const m = (await engineer.next("metrics", (x) => x.candidates.notch?.noiseLineHz === 120)).candidates.notch;
    expect(m.predictedAttenuationDb).toBeLessThan(3); // 120 Hz is in the notch's passband
    engineer.send({ type: "noise-line", channel, freqHz: 600 });
    expect((await engineer.next("error")).message).toMatch(/between 0 and 500 Hz/);
    engineer.send({ type: "noise-line", channel, freqHz: null });
    expect((await engineer.next("metrics", (x) => x.candidates.notch?.noiseLineHz !== 120 && x.candidates.notch?.noiseLineHz !== null)).candidates.notch.noiseLineHz).toBeCloseTo(50, 0);
    engineer.ws.close();
    const operator = await openSocket(sidecar.httpPort, await cookieFor(store.db, "operator@tapwright.test"));
    operator.send({ type: "noise-line", channel, freqHz: 50 });
    expect((await operator.next("error")).code).toBe("forbidden");
    operator.ws.close();
  }, 20_000);

  it("runs a chain candidate (notch 50, notch 150, low-pass) on the live stream: the hum lines fall", async () => {
    const engineer = await openSocket(sidecar.httpPort, await cookieFor(store.db, "engineer@tapwright.test"));
    const channel = "hydraulic-press/env-node/frame-strain";
    engineer.send({ type: "subscribe", channel });
    engineer.send({ type: "candidate.add", channel, id: "hum", spec: humChain });
    expect((await engineer.next("frame", (f) => f.channel === channel && f.traces.hum !== undefined)).traces.hum.length).toBeGreaterThan(0);
    const metrics = await engineer.next("metrics", (m) => m.candidates.hum?.measuredAttenuationDb !== null && m.candidates.hum?.measuredAttenuationDb !== undefined);
    const m = metrics.candidates.hum;
    expect(m.noiseLineHz).toBeCloseTo(50, 0);
    expect(m.predictedAttenuationDb).toBeGreaterThan(40);
    expect(m.measuredAttenuationDb).toBeGreaterThan(15);
    engineer.ws.close();
  }, 15_000);

  it("a chain with a matching checksum is applied and acknowledged", async () => {
    const config = signConfig(unsigned);
    expect(deviceConfigSchema.parse(config)).toEqual(config);
    const outcome = await sidecar.configs.send("gearbox-endurance", "torque-node", config, 5000);
    expect(outcome.status).toBe("applied");
  });

  it("a wrong checksum, format or channel is refused with the reason", async () => {
    const signed = signConfig(unsigned);
    const tampered = { ...signed, channels: { ...signed.channels, "shaft-speed": signed.channels["input-torque"] } };
    expect(await sidecar.configs.send("gearbox-endurance", "torque-node", tampered, 5000)).toMatchObject({
      status: "refused",
      ack: { reason: "checksum mismatch" },
    });
    const f32 = { revisionId: "rev-43", format: "f32" as const, sampleRateHz: 1000, stages: [{ kind: "sections" as const, sections: [[1, 0, 0, 1, 0, 0]] }] };
    const wrongFormat = signConfig({ ...unsigned, configId: "rev-43", channels: { ...unsigned.channels, "input-torque": f32 } });
    expect(await sidecar.configs.send("gearbox-endurance", "torque-node", wrongFormat, 5000)).toMatchObject({
      status: "refused",
      ack: { configId: "rev-43", reason: "input-torque: this device runs q15, not f32" },
    });
  });

  it("times out when no device answers", async () => {
    const outcome = await sidecar.configs.send("gearbox-endurance", "no-such-node", signConfig({ ...unsigned, device: "gearbox-endurance/no-such-node" }), 200);
    expect(outcome.status).toBe("timeout");
  });
});
