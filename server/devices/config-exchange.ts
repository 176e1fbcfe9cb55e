import { ACK_FILTER, configTopic, deviceAckSchema, parseTopic, type DeviceAck, type DeviceConfig } from "@/lib/protocol";
import type { MessageBus } from "../broker/bus";
import type { Clock, Logger } from "../clock";
import { errorMessage } from "@/lib/errors";

/**
 * Who published an acknowledgement: an authenticated device identity (the embedded broker knows
 * it), `topic` where the broker's own ACL binds topics to identities (an external broker configured
 * as docs/operations.md shows, or device authentication switched off for development), or null for anyone
 * else (an internal client, an unauthenticated one).
 */
export type AckPublisher = { kind: "device"; rig: string; device: string } | { kind: "topic" } | null;

/** Delivers every message on a device ack topic, with its publisher. */
export type AckFeed = (handler: (topic: string, payload: Buffer, from: AckPublisher) => void) => Promise<void>;

/** Acks from the bus subscription, trusting the topic (the broker enforces who may publish there). */
export function busAckFeed(bus: MessageBus): AckFeed {
  return (handler) => bus.subscribe(ACK_FILTER, (topic, payload) => handler(topic, payload, { kind: "topic" }));
}

export type ConfigOutcome =
  | { status: "applied"; ack: DeviceAck }
  | { status: "refused"; ack: DeviceAck }
  | { status: "timeout" };

/** Sends filter configurations to devices and waits for their acknowledgements (used by promotion). */
export interface ConfigExchange {
  /**
   * Publishes the device configuration document retained (QoS 1) on the device's config topic and
   * resolves with the first ack carrying the same configId and checksum, or "timeout" after
   * timeoutMs. Acks for other documents are ignored. The caller sends one document per device at a
   * time (server/deploy serialises them).
   */
  send(rig: string, device: string, config: DeviceConfig, timeoutMs: number): Promise<ConfigOutcome>;
}

interface Waiter {
  device: string;
  configId: string;
  checksum: string;
  settle: (outcome: ConfigOutcome) => void;
}

/**
 * An acknowledgement counts only when it comes from the device that owns the topic; anything else is
 * passed to onForeign (counted and logged at a limited rate by the caller) and ignored.
 */
export async function createConfigExchange(deps: {
  bus: MessageBus;
  clock: Clock;
  logger: Logger;
  acks?: AckFeed;
  onForeign?: (device: string, why: string) => void;
}): Promise<ConfigExchange> {
  const waiters = new Set<Waiter>();
  const feed = deps.acks ?? busAckFeed(deps.bus);

  await feed((topic, payload, from) => {
    try {
      const t = parseTopic(topic);
      if (!t || t.kind !== "ack") return;
      const owner = `${t.rig}/${t.device}`;
      if (from === null) return deps.onForeign?.(owner, "published by a client that is not the device");
      if (from.kind === "device" && `${from.rig}/${from.device}` !== owner) {
        return deps.onForeign?.(owner, `published by device ${from.rig}/${from.device}`);
      }
      const parsed = deviceAckSchema.safeParse(JSON.parse(payload.toString("utf8")));
      if (!parsed.success) return deps.logger.warn(`ignored malformed ack on ${topic}`);
      const ack = parsed.data;
      for (const w of waiters) {
        if (w.device === `${t.rig}/${t.device}` && w.configId === ack.configId && w.checksum === ack.checksum) {
          w.settle({ status: ack.status, ack });
        }
      }
    } catch (err) {
      deps.logger.warn(`ack handler failed: ${errorMessage(err)}`);
    }
  });

  return {
    send(rig, device, config, timeoutMs) {
      return new Promise<ConfigOutcome>((resolve, reject) => {
        const timer = deps.clock.setTimeout(() => waiter.settle({ status: "timeout" }), timeoutMs);
        const waiter: Waiter = {
          device: `${rig}/${device}`,
          configId: config.configId,
          checksum: config.checksum,
          settle(outcome) {
            if (!waiters.delete(waiter)) return;
            deps.clock.clearTimeout(timer);
            resolve(outcome);
          },
        };
        waiters.add(waiter);
        deps.bus.publish(configTopic(rig, device), JSON.stringify(config), { retain: true, qos: 1 }).catch((err: unknown) => {
          if (!waiters.delete(waiter)) return;
          deps.clock.clearTimeout(timer);
          reject(err);
        });
      });
    },
  };
}
