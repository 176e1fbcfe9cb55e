import mqtt, { type IClientOptions, type MqttClient } from "mqtt";
import type { Clock, Logger } from "../clock";
import { topicFilter, type BusState, type MessageBus, type MessageHandler } from "./bus";

export interface MqttBusOptions {
  url: string;
  username?: string;
  password?: string;
  /** PEM certificate authority for mqtts:// brokers with a private CA. */
  ca?: Buffer;
  /** MQTT protocol version; 5 is needed for shared subscriptions on brokers that only offer them to v5 clients. */
  protocolVersion?: 4 | 5;
  clientId?: string;
  clock: Clock;
  logger: Logger;
  /** Uniform [0, 1) source for the backoff jitter. */
  random?: () => number;
  /** First and largest reconnect delay in ms. */
  backoffMs?: { initial: number; max: number };
}

/**
 * Delay before reconnect attempt `attempt` (0-based): "full jitter" exponential backoff,
 * uniform in [0, min(max, initial·2^attempt)] (Brooker, "Exponential Backoff and Jitter", AWS Architecture Blog, 2015).
 */
export function backoffDelay(attempt: number, initial: number, max: number, random: () => number): number {
  return Math.round(random() * Math.min(max, initial * 2 ** attempt));
}

/**
 * A bus over an mqtt.js connection. mqtt.js's own fixed-period reconnect is off; this module
 * reconnects with exponential backoff and jitter and subscribes again on every connect (the
 * session is clean, so the broker has forgotten the subscriptions).
 */
export function connectMqttBus(opts: MqttBusOptions): MessageBus & { client: MqttClient } {
  const random = opts.random ?? Math.random;
  const { initial, max } = opts.backoffMs ?? { initial: 250, max: 10_000 };
  /** Filters with wildcards are matched one by one; plain topics (a channel's samples) by one map lookup. */
  const handlers: Array<{ filter: string; matches: (topic: string) => boolean; handler: MessageHandler }> = [];
  const exact = new Map<string, MessageHandler[]>();
  const listeners: Array<(s: BusState) => void> = [];
  let state: BusState = "reconnecting";
  let attempt = 0;
  let retry: ReturnType<Clock["setTimeout"]> | undefined;
  let closing = false;

  const clientOpts: IClientOptions = {
    username: opts.username,
    password: opts.password,
    ca: opts.ca,
    protocolVersion: opts.protocolVersion ?? 4,
    clientId: opts.clientId,
    clean: true,
    reconnectPeriod: 0,
    resubscribe: false,
    connectTimeout: 5000,
  };
  const client = mqtt.connect(opts.url, clientOpts);

  function setState(next: BusState): void {
    if (next === state) return;
    state = next;
    for (const l of listeners) l(state);
  }

  // "connected" is reported once the broker has acknowledged the subscriptions, so messages flow from then on.
  client.on("connect", () => {
    attempt = 0;
    const filters = [...new Set([...handlers.map((h) => h.filter), ...exact.keys()])];
    if (!filters.length) return setState("connected");
    client.subscribe(filters, { qos: 0 }, (err) => {
      if (err) opts.logger.warn(`MQTT subscribe failed: ${err.message}`);
      else setState("connected");
    });
  });
  client.on("message", (topic, payload) => {
    for (const handler of exact.get(topic) ?? []) handler(topic, payload);
    for (const h of handlers) if (h.matches(topic)) h.handler(topic, payload);
  });
  client.on("error", (err) => opts.logger.warn(`MQTT: ${err.message}`));
  client.on("close", () => {
    if (closing) return;
    setState("reconnecting");
    if (retry !== undefined) return;
    const delay = backoffDelay(attempt++, initial, max, random);
    retry = opts.clock.setTimeout(() => {
      retry = undefined;
      if (!closing) client.reconnect();
    }, delay);
  });

  return {
    client,
    get state() {
      return state;
    },
    async subscribe(filter, handler) {
      if (/[+#]/.test(filter) || filter.startsWith("$share/")) handlers.push({ filter, matches: topicFilter(filter), handler });
      else exact.set(filter, [...(exact.get(filter) ?? []), handler]);
      if (client.connected) await client.subscribeAsync(filter, { qos: 0 });
    },
    async unsubscribe(filter) {
      exact.delete(filter);
      for (let i = handlers.length - 1; i >= 0; i--) if (handlers[i].filter === filter) handlers.splice(i, 1);
      if (client.connected) await client.unsubscribeAsync(filter);
    },
    async publish(topic, payload, publishOpts = {}) {
      await client.publishAsync(topic, payload, { qos: publishOpts.qos ?? 0, retain: publishOpts.retain ?? false });
    },
    onState(listener) {
      listeners.push(listener);
    },
    async close() {
      closing = true;
      if (retry !== undefined) opts.clock.clearTimeout(retry);
      await client.endAsync(true);
      setState("closed");
    },
  };
}
