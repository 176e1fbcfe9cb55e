import mqtt, { type MqttClient } from "mqtt";
import { DEMO_RIGS, type DemoDevice, type DemoRig } from "@/lib/demo/lab";
import { configTopic, ackTopic, encodeBinarySamples, MAX_VALUES, samplesTopic, statusTopic } from "@/lib/protocol";
import type { Clock, Logger, Timer } from "../clock";
import { answerConfig } from "./config-handler";
import { fnv1a } from "./prng";
import { DEFAULT_RECIPE, RECIPES } from "./recipes";
import { createSignalSource, type SignalSource } from "./signals";
import { errorMessage } from "@/lib/errors";

/** Channels at or above this rate publish the binary form; slower ones JSON (so both forms are exercised). */
const BINARY_FROM_HZ = 2000;

interface ChannelStream {
  path: string;
  sampleRateHz: number;
  source: SignalSource;
  emitted: number;
  seq: number;
}

interface DeviceClient {
  rig: string;
  device: DemoDevice;
  client: MqttClient;
  channels: ChannelStream[];
}

export interface DemoRigOptions {
  url: string;
  /** The credential each simulated device signs in with (none where the broker takes anonymous clients). */
  credentials?: (rig: string, device: string) => { username: string; password: string };
  clock: Clock;
  logger: Logger;
  seed: number;
  /** Milliseconds of samples per message. */
  batchMs?: number;
  rigs?: readonly DemoRig[];
}

export interface DemoRigHandle {
  stop(): Promise<void>;
  /** Messages published and batches deliberately dropped so far. */
  readonly counts: { published: number; dropped: number };
  /** The configId of the last document a device applied (`<rig>/<device>`), if any. */
  appliedConfigId(device: string): string | undefined;
}

function jsonPayload(seq: number, t0: number, fs: number, values: Float64Array): string {
  const rounded = Array.from(values, (v) => Number(v.toPrecision(7)));
  return JSON.stringify({ seq, t0, sampleRateHz: fs, values: rounded });
}

/**
 * The demo rig: one MQTT connection per device, exactly like a device (retained online status, an
 * offline last will, its own config topic answered with acks), publishing every channel at its
 * sample rate in batches of about batchMs, deterministically from the seed and the given clock.
 */
export async function startDemoRig(opts: DemoRigOptions): Promise<DemoRigHandle> {
  const batchMs = opts.batchMs ?? 20;
  const counts = { published: 0, dropped: 0 };
  const startedAt = opts.clock.now();
  const devices: DeviceClient[] = [];
  const applied = new Map<string, string>();

  for (const rig of opts.rigs ?? DEMO_RIGS) {
    for (const device of rig.devices) {
      const status = statusTopic(rig.key, device.key);
      const credential = opts.credentials?.(rig.key, device.key);
      const client = await mqtt.connectAsync(opts.url, {
        clientId: `demo-${rig.key}-${device.key}`,
        username: credential?.username,
        password: credential?.password,
        will: { topic: status, payload: Buffer.from(JSON.stringify({ state: "offline" })), qos: 1, retain: true },
        queueQoSZero: false,
        reconnectPeriod: 1000,
      });
      client.on("error", (err) => opts.logger.warn(`demo ${device.key}: ${err.message}`));
      const announce = () => {
        client.publish(status, JSON.stringify({ state: "online" }), { qos: 1, retain: true });
        client.subscribe(configTopic(rig.key, device.key), { qos: 1 });
      };
      client.on("connect", announce);
      announce();
      client.on("message", (topic, payload) => {
        try {
          const ack = answerConfig(rig.key, device, payload);
          if (ack?.status === "applied") applied.set(`${rig.key}/${device.key}`, ack.configId);
          if (ack) client.publish(ackTopic(rig.key, device.key), JSON.stringify(ack), { qos: 1 });
        } catch (err) {
          opts.logger.warn(`demo ${device.key} config handler: ${errorMessage(err)}`);
        }
      });
      const channels = device.channels.map((c) => {
        const path = `${rig.key}/${device.key}/${c.key}`;
        const recipe = RECIPES[path] ?? DEFAULT_RECIPE;
        return { path, sampleRateHz: c.sampleRateHz, source: createSignalSource(recipe, c.sampleRateHz, opts.seed ^ fnv1a(path)), emitted: 0, seq: 0 };
      });
      devices.push({ rig: rig.key, device, client, channels });
    }
  }

  function publishDue(d: DeviceClient, ch: ChannelStream, now: number): void {
    let due = Math.floor(((now - startedAt) * ch.sampleRateHz) / 1000) - ch.emitted;
    while (due > 0) {
      const n = Math.min(due, MAX_VALUES);
      const t0 = startedAt + (ch.emitted * 1000) / ch.sampleRateHz;
      const values = ch.source.next(n);
      const seq = ch.seq;
      ch.seq = (ch.seq + 1) >>> 0;
      ch.emitted += n;
      due -= n;
      if (ch.source.dropNext()) {
        counts.dropped++;
        continue;
      }
      const payload =
        ch.sampleRateHz >= BINARY_FROM_HZ
          ? Buffer.from(encodeBinarySamples({ seq, t0, sampleRateHz: ch.sampleRateHz, values }))
          : jsonPayload(seq, t0, ch.sampleRateHz, values);
      if (d.client.connected) {
        d.client.publish(samplesTopic(ch.path), payload, { qos: 0 });
        counts.published++;
      }
    }
  }

  const timer: Timer = opts.clock.setInterval(() => {
    const now = opts.clock.now();
    for (const d of devices) for (const ch of d.channels) publishDue(d, ch, now);
  }, batchMs);

  return {
    counts,
    appliedConfigId: (device) => applied.get(device),
    async stop() {
      opts.clock.clearInterval(timer);
      await Promise.all(
        devices.map(async (d) => {
          await d.client.publishAsync(statusTopic(d.rig, d.device.key), JSON.stringify({ state: "offline" }), { qos: 1, retain: true }).catch((err: unknown) => opts.logger.warn(`demo ${d.device.key}: publishing its offline status failed: ${errorMessage(err)}`));
          await d.client.endAsync();
        }),
      );
    },
  };
}
