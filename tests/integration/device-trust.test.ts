import { resolve } from "node:path";
import mqtt from "mqtt";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Db } from "@/db/client";
import { demoDeviceCredential } from "@/lib/demo/device-credentials";
import { ackTopic, configTopic, type DeviceConfig } from "@/lib/protocol";
import { deviceAuthHooks } from "@/server/broker/device-auth";
import { startEmbeddedBroker } from "@/server/broker/embedded";
import { signConfig } from "@/server/devices/checksum";
import { systemClock } from "@/server/clock";
import { createConfigExchange, type AckFeed } from "@/server/devices/config-exchange";
import type { Sidecar } from "@/server/sidecar";
import { connectDevice, memoryLogger, mosquitto, SECRET, seededDb, testSidecar, until } from "./sidecar-support";

const ENV_NODE = demoDeviceCredential(SECRET, "hydraulic-press", "env-node");
const TORQUE_NODE = demoDeviceCredential(SECRET, "gearbox-endurance", "torque-node");
const MONITOR = { username: "monitor", password: "monitor-secret-0123456789" };

let store: { db: Db; close: () => Promise<void> };
let sidecar: Sidecar;

beforeAll(async () => {
  store = await seededDb("device_trust");
  sidecar = await testSidecar(store.db, {
    mqtt: { mode: "embedded", host: "127.0.0.1", port: 0, requireDeviceAuth: true, internal: [MONITOR] },
  });
});

afterAll(async () => {
  await sidecar?.close();
  await store?.close();
});

/** A config document for env-node with every channel pass-through, signed like the sidecar's. */
function envNodeDocument(configId: string): DeviceConfig {
  return signConfig({ v: 3, device: "hydraulic-press/env-node", configId, channels: { "frame-strain": null, "ambient-temp": null } });
}

/** Resolves true when the subscription was granted, false when the broker refused it (SUBACK 128) or dropped the client. */
async function subscribeGranted(client: mqtt.MqttClient, topic: string): Promise<boolean> {
  try {
    const granted = await client.subscribeAsync(topic, { qos: 1 });
    return granted.every((g) => g.qos !== 128);
  } catch {
    return false;
  }
}

describe("identity on the embedded broker", () => {
  it("refuses anonymous clients and wrong passwords", async () => {
    await expect(connectDevice(sidecar.mqttUrl)).rejects.toThrow();
    await expect(connectDevice(sidecar.mqttUrl, { username: ENV_NODE.username, password: "wrong" })).rejects.toThrow();
  });

  it("a device may read only its own config: not '#', not $SYS, not another device's topics", async () => {
    for (const topic of ["#", "$SYS/#", configTopic("gearbox-endurance", "torque-node"), "tapwright/v1/+/+/config", ackTopic("hydraulic-press", "env-node")]) {
      const device = await connectDevice(sidecar.mqttUrl, ENV_NODE);
      expect(await subscribeGranted(device, topic), topic).toBe(false);
      await device.endAsync(true);
    }
    const device = await connectDevice(sidecar.mqttUrl, ENV_NODE);
    expect(await subscribeGranted(device, configTopic("hydraulic-press", "env-node"))).toBe(true);
    await device.endAsync();
  });

  it("an internal credential reads every topic", async () => {
    const monitor = await connectDevice(sidecar.mqttUrl, MONITOR);
    expect(await subscribeGranted(monitor, "tapwright/v1/#")).toBe(true);
    await monitor.endAsync();
  });
});

describe("acknowledgements are bound to the device's identity", () => {
  it("a forged ack from another device or an internal client leaves the document unacknowledged; the device's own ack applies it", async () => {
    const device = await connectDevice(sidecar.mqttUrl, ENV_NODE);
    const received: DeviceConfig[] = [];
    device.on("message", (_topic, payload) => received.push(JSON.parse(payload.toString("utf8")) as DeviceConfig));
    await device.subscribeAsync(configTopic("hydraulic-press", "env-node"), { qos: 1 });

    const forged = envNodeDocument("forged-1");
    const pending = sidecar.configs.send("hydraulic-press", "env-node", forged, 1500);
    await until(() => received.some((c) => c.configId === "forged-1"), 5000, "the document at the device");
    const ack = JSON.stringify({ v: 3, configId: forged.configId, checksum: forged.checksum, status: "applied" });
    for (const spoofer of [TORQUE_NODE, MONITOR]) {
      const c = await connectDevice(sidecar.mqttUrl, spoofer);
      c.publish(ackTopic("hydraulic-press", "env-node"), ack, { qos: 0 });
      await new Promise((r) => setTimeout(r, 100));
      await c.endAsync(true);
    }
    expect((await pending).status).toBe("timeout");

    const real = envNodeDocument("real-1");
    const applied = sidecar.configs.send("hydraulic-press", "env-node", real, 5000);
    await until(() => received.some((c) => c.configId === "real-1"), 5000, "the second document at the device");
    await device.publishAsync(ackTopic("hydraulic-press", "env-node"), JSON.stringify({ v: 3, configId: real.configId, checksum: real.checksum, status: "applied" }), { qos: 1 });
    expect((await applied).status).toBe("applied");
    await device.endAsync();
  });

  it("the exchange ignores and counts an ack whose publisher is not the topic's device", async () => {
    let deliver: Parameters<AckFeed>[0] = () => undefined;
    const foreign: string[] = [];
    const logger = memoryLogger();
    const exchange = await createConfigExchange({
      bus: sidecar.bus,
      clock: systemClock,
      logger,
      acks: async (handler) => {
        deliver = handler;
      },
      onForeign: (device, why) => foreign.push(`${device}: ${why}`),
    });
    const doc = envNodeDocument("bound-1");
    const outcome = exchange.send("hydraulic-press", "env-node", doc, 300);
    const ack = Buffer.from(JSON.stringify({ v: 3, configId: doc.configId, checksum: doc.checksum, status: "applied" }));
    deliver(ackTopic("hydraulic-press", "env-node"), ack, { kind: "device", rig: "gearbox-endurance", device: "torque-node" });
    deliver(ackTopic("hydraulic-press", "env-node"), ack, null);
    expect((await outcome).status).toBe("timeout");
    expect(foreign).toEqual([
      "hydraulic-press/env-node: published by device gearbox-endurance/torque-node",
      "hydraulic-press/env-node: published by a client that is not the device",
    ]);
  });
});

describe("broker sign-in cost", () => {
  // A broker of its own whose throttle never delays, so only the verification itself is timed.
  let url: string;
  let close: () => Promise<void>;
  beforeAll(async () => {
    const { hooks } = deviceAuthHooks({ db: store.db, internal: [MONITOR], logger: memoryLogger(), clock: systemClock, throttle: { freeFailures: 1_000_000 } });
    const broker = await startEmbeddedBroker({ host: "127.0.0.1", port: 0, hooks });
    url = `mqtt://127.0.0.1:${broker.port}`;
    close = () => broker.close();
  });
  afterAll(async () => close?.());

  /** Time until a wrong password for `username` is refused (ms). */
  async function refusalMs(username: string): Promise<number> {
    const start = performance.now();
    await expect(connectDevice(url, { username, password: "not the password" })).rejects.toThrow();
    return performance.now() - start;
  }

  const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];

  // The three kinds are sampled in turn, round after round, so a change in the machine's load during
  // the test weighs on all three alike; the medians of 21 rounds are compared.
  it("an unknown username (or an internal one) costs the same time as a known device's (within 20 %)", async () => {
    const names = { known: ENV_NODE.username, unknown: "no-such-rig/no-such-device", internal: MONITOR.username };
    for (const name of Object.values(names)) await refusalMs(name); // warm up the decoy hash and the pool
    const times = { known: [] as number[], unknown: [] as number[], internal: [] as number[] };
    for (let round = 0; round < 21; round++) {
      for (const kind of ["known", "unknown", "internal"] as const) times[kind].push(await refusalMs(names[kind]));
    }
    const known = median(times.known);
    expect(Math.abs(median(times.unknown) - known) / known).toBeLessThan(0.2);
    expect(Math.abs(median(times.internal) - known) / known).toBeLessThan(0.2);
  }, 120_000);
});

describe("identity on Debian's mosquitto with the ACL file of docs/operations.md", () => {
  const SIDECAR = { username: "tapwright-sidecar", password: "sidecar-secret-0123456789" };
  let broker: Awaited<ReturnType<typeof mosquitto>>;

  beforeAll(async () => {
    broker = await mosquitto({ users: [SIDECAR, ENV_NODE, TORQUE_NODE], aclFile: resolve("docs/mosquitto-acl.conf") });
  });
  afterAll(async () => broker?.stop());

  it("refuses anonymous clients", async () => {
    await expect(connectDevice(broker.url)).rejects.toThrow();
  });

  it("lets a device read its own config only, and write only its own topics", async () => {
    const device = await connectDevice(broker.url, ENV_NODE);
    const other = await connectDevice(broker.url, TORQUE_NODE);
    const sidecarClient = await connectDevice(broker.url, SIDECAR);
    const seen: string[] = [];
    device.on("message", (topic) => seen.push(topic));
    const sidecarSeen: string[] = [];
    sidecarClient.on("message", (topic) => sidecarSeen.push(topic));
    await sidecarClient.subscribeAsync("tapwright/v1/#", { qos: 1 });
    // mosquitto grants the subscription but delivers nothing the ACL denies.
    await device.subscribeAsync(["#", configTopic("gearbox-endurance", "torque-node"), configTopic("hydraulic-press", "env-node")], { qos: 1 });
    await sidecarClient.publishAsync(configTopic("gearbox-endurance", "torque-node"), "{}", { qos: 1 });
    await sidecarClient.publishAsync(configTopic("hydraulic-press", "env-node"), "{}", { qos: 1 });
    await other.publishAsync(ackTopic("hydraulic-press", "env-node"), "{\"forged\":true}", { qos: 1 });
    await device.publishAsync(ackTopic("hydraulic-press", "env-node"), "{\"real\":true}", { qos: 1 });
    await until(() => sidecarSeen.includes(ackTopic("hydraulic-press", "env-node")), 5000, "the device's own ack at the sidecar");
    await new Promise((r) => setTimeout(r, 200));
    expect(seen).toEqual([configTopic("hydraulic-press", "env-node")]);
    expect(sidecarSeen.filter((t) => t === ackTopic("hydraulic-press", "env-node"))).toHaveLength(1);
    await Promise.all([device.endAsync(), other.endAsync(), sidecarClient.endAsync()]);
  });
});
