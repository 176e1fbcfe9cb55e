import net from "node:net";
import { Aedes, type AedesOptions } from "aedes";
import type { BusState, MessageBus, MessageHandler } from "./bus";

export interface EmbeddedBroker {
  broker: Aedes;
  /** The port actually bound (useful with port 0). */
  port: number;
  close(): Promise<void>;
}

/**
 * Aedes on a loopback TCP listener. Nagle is off on every socket (delayed ACKs otherwise add
 * ~40 ms tails); concurrency is raised because the default queue can collapse above ~15 k msg/s.
 */
export async function startEmbeddedBroker(opts: {
  host: string;
  port: number;
  hooks?: Pick<AedesOptions, "authenticate" | "authorizePublish" | "authorizeSubscribe">;
}): Promise<EmbeddedBroker> {
  const broker = await Aedes.createBroker({ concurrency: 10000, ...opts.hooks });
  const server = net.createServer((socket) => {
    socket.setNoDelay(true);
    broker.handle(socket);
  });
  await new Promise<void>((resolve, reject) => {
    server.once("error", reject);
    server.listen(opts.port, opts.host, () => resolve());
  });
  const address = server.address();
  const port = typeof address === "object" && address ? address.port : opts.port;
  const sockets = new Set<net.Socket>();
  server.on("connection", (s) => {
    sockets.add(s);
    s.on("close", () => sockets.delete(s));
  });
  return {
    broker,
    port,
    async close() {
      for (const s of sockets) s.destroy();
      await new Promise<void>((resolve) => server.close(() => resolve()));
      await new Promise<void>((resolve) => broker.close(() => resolve()));
    },
  };
}

type Deliver = Parameters<Aedes["subscribe"]>[1];

/** A bus subscribed inside the broker's process: no socket, no serialisation between them. */
export function inProcessBus(broker: Aedes): MessageBus {
  const listeners: Array<(s: BusState) => void> = [];
  /** Aedes unsubscribes a handler by the same function it was given. */
  const subscribed = new Map<string, Deliver[]>();
  let state: BusState = "connected";
  return {
    get state() {
      return state;
    },
    subscribe(filter: string, handler: MessageHandler) {
      const deliver: Deliver = (packet, done) => {
        const payload = typeof packet.payload === "string" ? Buffer.from(packet.payload) : packet.payload;
        handler(packet.topic, payload);
        done();
      };
      subscribed.set(filter, [...(subscribed.get(filter) ?? []), deliver]);
      return new Promise<void>((resolve) => broker.subscribe(filter, deliver, resolve));
    },
    async unsubscribe(filter: string) {
      const delivers = subscribed.get(filter) ?? [];
      subscribed.delete(filter);
      for (const deliver of delivers) await new Promise<void>((resolve) => broker.unsubscribe(filter, deliver, resolve));
    },
    publish(topic, payload, opts = {}) {
      return new Promise<void>((resolve, reject) => {
        broker.publish(
          {
            cmd: "publish",
            topic,
            payload: typeof payload === "string" ? Buffer.from(payload) : payload,
            qos: opts.qos ?? 0,
            retain: opts.retain ?? false,
            dup: false,
          },
          (err) => (err ? reject(err) : resolve()),
        );
      });
    },
    onState(listener) {
      listeners.push(listener);
    },
    async close() {
      state = "closed";
      for (const l of listeners) l(state);
    },
  };
}
