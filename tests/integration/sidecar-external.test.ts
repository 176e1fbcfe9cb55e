import type { MqttClient } from "mqtt";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Db } from "@/db/client";
import { designFilter, filterSignal } from "@/lib/dsp";
import { filteredTopic, samplesTopic, type FrameMessage } from "@/lib/protocol";
import { startEmbeddedBroker, type EmbeddedBroker } from "@/server/broker/embedded";
import type { Sidecar } from "@/server/sidecar";
import { connectDevice, cookieFor, freePort, mosquitto, openSocket, seededDb, testSidecar, until } from "./sidecar-support";

const STRAIN = "hydraulic-press/env-node/frame-strain"; // 1 kHz

interface ExternalBroker {
  url: string;
  start(): Promise<void>;
  stop(): Promise<void>;
}

/** A standalone Aedes on its own port, reached by the sidecar over TCP like any external broker. */
async function aedesBroker(): Promise<ExternalBroker> {
  const port = await freePort();
  let running: EmbeddedBroker | undefined;
  const start = async () => {
    running = await startEmbeddedBroker({ host: "127.0.0.1", port });
  };
  await start();
  return { url: `mqtt://127.0.0.1:${port}`, start, stop: async () => running?.close() };
}

const brokers: Array<[string, () => Promise<ExternalBroker>]> = [
  ["mosquitto", mosquitto],
  ["aedes over TCP", aedesBroker],
];

let store: { db: Db; close: () => Promise<void> };
beforeAll(async () => {
  store = await seededDb("sidecar_external");
});
afterAll(async () => store?.close());

function batch(seq: number, values: number[]): string {
  return JSON.stringify({ seq, t0: seq * 20, sampleRateHz: 1000, values });
}

describe.each(brokers)("ingest through an external broker: %s", (_name, makeBroker) => {
  let broker: ExternalBroker;
  let sidecar: Sidecar;
  let device: MqttClient;

  beforeAll(async () => {
    broker = await makeBroker();
    sidecar = await testSidecar(store.db, {
      mqtt: { mode: "external", url: broker.url, backoffMs: { initial: 50, max: 400 } },
      republishFiltered: true,
    });
    await until(() => sidecar.bus.state === "connected", 5000, "the sidecar's connection");
    device = await connectDevice(broker.url, { reconnectPeriod: 100, queueQoSZero: false });
  });

  afterAll(async () => {
    await device?.endAsync(true);
    await sidecar?.close();
    await broker?.stop();
  });

  it("ingests, filters and republishes the production trace on /filtered", async () => {
    const notch = designFilter({ kind: "biquad", shape: "notch", centerHz: 50, q: 5, sampleRateHz: 1000 });
    sidecar.pipeline.setProductionFilter(STRAIN, "rev-9", notch);
    const listener = await connectDevice(broker.url);
    const filtered: number[] = [];
    listener.on("message", (_t, p) => filtered.push(...(JSON.parse(p.toString()) as { values: number[] }).values));
    await listener.subscribeAsync(filteredTopic(STRAIN));
    const x = Array.from({ length: 200 }, (_, i) => Math.sin(i / 3) + (i % 7));
    for (let k = 0; k < 10; k++) await device.publishAsync(samplesTopic(STRAIN), batch(k, x.slice(k * 20, k * 20 + 20)));
    await until(() => filtered.length === 200, 5000, "the filtered republish");
    expect(filtered).toEqual(Array.from(filterSignal(notch, Float64Array.from(x), { initial: "step" })));
    await listener.endAsync();
    sidecar.pipeline.setProductionFilter(STRAIN, "rev-9", null);
  });

  it("resumes the stream after the broker is killed and restarted, telling browsers meanwhile", async () => {
    const browser = await openSocket(sidecar.httpPort, await cookieFor(store.db, "operator@tapwright.test"));
    browser.send({ type: "subscribe", channel: STRAIN });
    let seq = 1000;
    const timer = setInterval(() => {
      if (device.connected) device.publish(samplesTopic(STRAIN), batch(seq, [seq]));
      seq++;
    }, 10);
    try {
      await until(() => sidecar.ingest.accepted.messages > 20, 5000, "the stream");
      await broker.stop();
      await until(() => sidecar.bus.state === "reconnecting", 5000, "the sidecar to notice");
      expect((await browser.next("status", (m) => m.mqtt === "reconnecting")).mqtt).toBe("reconnecting");
      const health = (await (await fetch(`http://127.0.0.1:${sidecar.httpPort}/health`)).json()) as { mqtt: string };
      expect(health.mqtt).toBe("reconnecting");

      await broker.start();
      await until(() => sidecar.bus.state === "connected", 10_000, "the reconnect");
      await browser.next("status", (m) => m.mqtt === "connected");
      const resumedFrom = sidecar.ingest.accepted.messages;
      await until(() => sidecar.ingest.accepted.messages > resumedFrom + 10, 10_000, "samples after the restart");
      sidecar.hub.tick();
      const frame = await browser.next("frame", (m: FrameMessage) => m.channel === STRAIN);
      expect(frame.raw.length).toBeGreaterThan(0);
      expect(sidecar.faults.totals().seq_gap ?? 0).toBeGreaterThan(0);
    } finally {
      clearInterval(timer);
      browser.ws.close();
    }
  });
});

describe("several sidecars sharing channels through an MQTT 5 shared subscription (mosquitto)", () => {
  it("each message reaches exactly one sidecar of the group", async () => {
    const broker = await mosquitto();
    const mqtt = { mode: "external" as const, url: broker.url, sharedGroup: "tapwright" };
    const a = await testSidecar(store.db, { mqtt });
    const b = await testSidecar(store.db, { mqtt });
    const device = await connectDevice(broker.url);
    try {
      await until(() => a.bus.state === "connected" && b.bus.state === "connected", 5000, "both sidecars");
      for (let k = 0; k < 200; k++) await device.publishAsync(samplesTopic(STRAIN), batch(k, [k]));
      const total = () => a.ingest.accepted.messages + b.ingest.accepted.messages;
      await until(() => total() === 200, 5000, "all 200 messages");
      expect(a.ingest.accepted.messages).toBeGreaterThan(0);
      expect(b.ingest.accepted.messages).toBeGreaterThan(0);
    } finally {
      await device.endAsync();
      await a.close();
      await b.close();
      await broker.stop();
    }
  });
});
