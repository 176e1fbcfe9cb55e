import type { Server } from "node:http";
import type { Db } from "@/db/client";
import { listChannels } from "@/db/queries/channels";
import { liveSessionAccounts } from "@/db/queries/sessions";
import { demoDeviceCredential } from "@/lib/demo/device-credentials";
import { errorMessage } from "@/lib/errors";
import type { FilterSpec, LiveDesign } from "@/lib/dsp";
import { filteredTopic, parseTopic, SAMPLES_FILTER, sharedFilter, type LiveOverview } from "@/lib/protocol";
import type { MessageBus } from "./broker/bus";
import { deviceAuthHooks, type DeviceAuth, type InternalCredential } from "./broker/device-auth";
import { inProcessBus, startEmbeddedBroker, type EmbeddedBroker } from "./broker/embedded";
import { connectMqttBus } from "./broker/mqtt-bus";
import type { Clock, Logger } from "./clock";
import { busAckFeed, createConfigExchange, type AckFeed, type ConfigExchange } from "./devices/config-exchange";
import { startDemoRig, type DemoRigHandle, type DemoRigOptions } from "./demo-rig/rig";
import { createHttpServer, listen } from "./http";
import { createFaultLog, type FaultLog } from "./ingest/fault-log";
import { createIngest, type Ingest } from "./ingest/ingest";
import { trackDeviceStatus, type DeviceStatusTracker } from "./ingest/status";
import { partitionChannels, type LeaseSettings } from "./cluster/partition";
import type { LeaseKeeper } from "./cluster/lease-keeper";
import { createPipeline, type Pipeline } from "./pipeline/pipeline";
import { throttledWarn } from "./throttled-log";
import { createHub, type Hub } from "./ws/hub";
import { createWsEndpoint } from "./ws/upgrade";

export type MqttSetup =
  | { mode: "embedded"; host: string; port: number; requireDeviceAuth: boolean; internal?: InternalCredential[] }
  | {
      mode: "external";
      url: string;
      username?: string;
      password?: string;
      ca?: Buffer;
      sharedGroup?: string;
      backoffMs?: { initial: number; max: number };
    };

export interface SidecarOptions {
  db: Db;
  clock: Clock;
  logger: Logger;
  sessionSecret: string;
  sessionTtlSeconds: number;
  http: { host: string; port: number; allowedOrigins?: string[] };
  /** Designs candidates' specs off the event loop (the design threads, with their time limit); `owner` is the connection. */
  design: (spec: FilterSpec, owner: string) => Promise<LiveDesign>;
  /** Per WebSocket connection: messages per second and burst; per user: open connections; per sidecar: candidate metrics per second. */
  ws?: { messageRate?: { perSecond: number; burst: number }; maxConnectionsPerUser?: number; metricsPerSecond?: number };
  mqtt: MqttSetup;
  republishFiltered: boolean;
  /**
   * Partitioned across sidecars (an external broker): hold leases on a share of the channels and
   * subscribe only to theirs. Without it this sidecar filters every channel (one sidecar).
   */
  leases?: LeaseSettings;
  /** Start the demo rig (its own MQTT connections) with this seed. */
  demo?: { seed: number };
  /** Start the frame, metrics and status timers (tests may drive hub.tick() themselves). */
  timers?: boolean;
  maxBufferedBytes?: number;
}

export interface Sidecar {
  httpPort: number;
  /** The embedded broker's port, when embedded. */
  mqttPort: number | undefined;
  /** The MQTT URL devices and the demo rig connect to. */
  mqttUrl: string;
  bus: MessageBus;
  pipeline: Pipeline;
  ingest: Ingest;
  faults: FaultLog;
  hub: Hub;
  configs: ConfigExchange;
  broker: EmbeddedBroker | undefined;
  devices: DeviceStatusTracker;
  /** The demo rig, when started. */
  demo: DemoRigHandle | undefined;
  /** The channel leases, when partitioned. */
  leases: LeaseKeeper | undefined;
  health(): { status: "ok" | "degraded" } & Record<string, unknown>;
  overview(): LiveOverview;
  close(): Promise<void>;
}

/**
 * Wires the sidecar from parts passed in: broker (embedded Aedes on loopback, or an external
 * broker through mqtt.js), ingest, pipeline, WebSocket hub, HTTP server and, on request, the demo rig.
 */
export async function startSidecar(opts: SidecarOptions): Promise<Sidecar> {
  const { clock, logger } = opts;
  const channels = (await listChannels(opts.db)).map((c) => ({ path: c.path, sampleRateHz: c.sampleRateHz }));
  const faults = createFaultLog({ clock, logger });
  /** When this sidecar started counting faults (epoch ms), the time base of the overview's counts. */
  const startedAt = clock.now();

  let broker: EmbeddedBroker | undefined;
  let bus: MessageBus;
  let mqttUrl: string;
  let acks: AckFeed | undefined;
  if (opts.mqtt.mode === "embedded") {
    const auth = opts.mqtt.requireDeviceAuth
      ? deviceAuthHooks({ db: opts.db, internal: [...(opts.mqtt.internal ?? [])], logger, clock })
      : undefined;
    broker = await startEmbeddedBroker({ host: opts.mqtt.host, port: opts.mqtt.port, hooks: auth?.hooks });
    bus = inProcessBus(broker.broker);
    mqttUrl = `mqtt://${opts.mqtt.host}:${broker.port}`;
    if (auth) acks = embeddedAckFeed(broker, auth.principalOf);
  } else {
    const { url, username, password, ca, sharedGroup, backoffMs } = opts.mqtt;
    bus = connectMqttBus({ url, username, password, ca, protocolVersion: sharedGroup ? 5 : 4, clock, logger, backoffMs });
    mqttUrl = url;
  }
  // Each simulated device signs in as itself, with the credential the seed stored for it.
  const demoCredentials: DemoRigOptions["credentials"] = (rig, device) => demoDeviceCredential(opts.sessionSecret, rig, device);

  const warnEvery = throttledWarn({ clock, logger });
  const pipeline = createPipeline({
    channels,
    now: () => clock.now(),
    onFiltered: opts.republishFiltered
      ? (path, batch, values) => {
          const payload = JSON.stringify({ seq: batch.seq, t0: batch.t0, sampleRateHz: batch.sampleRateHz, values: Array.from(values) });
          bus.publish(filteredTopic(path), payload).catch((err: unknown) => warnEvery(`republish ${path}`, `republishing ${path} failed: ${errorMessage(err)}`));
        }
      : undefined,
    onMetricsError: (path, id, err) => warnEvery(`metrics ${path} ${id}`, `metrics of candidate ${id} on ${path} failed: ${errorMessage(err)}`),
  });
  let leases: LeaseKeeper | undefined;
  const ingest = createIngest({ channels, sink: pipeline, faults, accepts: opts.leases ? (path) => leases?.owns(path) ?? false : undefined });
  if (!opts.leases) {
    const samplesFilter =
      opts.mqtt.mode === "external" && opts.mqtt.sharedGroup ? sharedFilter(opts.mqtt.sharedGroup, SAMPLES_FILTER) : SAMPLES_FILTER;
    await bus.subscribe(samplesFilter, (topic, payload) => ingest.handle(topic, payload));
  }
  const configs = await createConfigExchange({
    bus,
    clock,
    logger,
    acks: acks ?? busAckFeed(bus),
    onForeign: (device, why) => faults.record(device, "foreign_ack", why),
  });
  const devices = await trackDeviceStatus({ bus, logger });

  const hub = createHub({
    pipeline,
    faults,
    clock,
    logger,
    busState: () => bus.state,
    sessions: (ids) => liveSessionAccounts(opts.db, ids),
    design: opts.design,
    serves: opts.leases ? (path) => leases?.owns(path) ?? false : undefined,
    messageRate: opts.ws?.messageRate,
    metricsPerSecond: opts.ws?.metricsPerSecond,
    maxBufferedBytes: opts.maxBufferedBytes,
  });
  bus.onState((state) => {
    logger.info(`MQTT ${state}`);
    hub.statusTick();
  });
  if (opts.leases) {
    leases = partitionChannels({ db: opts.db, bus, pipeline, ingest, hub, leases: opts.leases, clock, logger });
    await leases.round();
    if (opts.timers !== false) leases.start();
  }
  /** The channels this sidecar filters now: its leases', or every channel. */
  const served = () => (leases ? leases.owned() : pipeline.paths());
  const ws = createWsEndpoint({
    db: opts.db,
    sessionSecret: opts.sessionSecret,
    sessionTtlSeconds: opts.sessionTtlSeconds,
    hub,
    logger,
    allowedOrigins: opts.http.allowedOrigins,
    maxConnectionsPerUser: opts.ws?.maxConnectionsPerUser,
  });

  function health() {
    return {
      status: bus.state === "connected" ? ("ok" as const) : ("degraded" as const),
      mqtt: bus.state,
      channels: served().length,
      sidecarId: opts.leases?.id,
      production: Object.fromEntries(
        served().flatMap((path) => {
          const revision = pipeline.productionRevision(path);
          return revision === null ? [] : [[path, revision]];
        }),
      ),
      clients: hub.clientCount,
      accepted: { ...ingest.accepted },
      faults: faults.totals(),
      faultsByChannel: faults.byChannel(),
    };
  }
  function overview(): LiveOverview {
    const faultsByChannel = faults.byChannel();
    return {
      now: clock.now(),
      mqtt: bus.state,
      channels: Object.fromEntries(
        served().map((path) => {
          const [rig, device] = path.split("/");
          const entry: LiveOverview["channels"][string] = {
            online: devices.online(rig, device),
            lastSampleAt: pipeline.lastSampleAt(path),
            productionRevisionId: pipeline.productionRevision(path),
            spark: pipeline.spark(path),
            faults: faultsByChannel[path] ?? {},
            faultsSince: startedAt,
          };
          return [path, entry];
        }),
      ),
    };
  }
  const recent = (path: string) => {
    const info = pipeline.channel(path);
    return info ? { sampleRateHz: info.sampleRateHz, values: pipeline.recent(path, Number.MAX_SAFE_INTEGER) } : null;
  };
  const server: Server = createHttpServer({ health, overview, recent, upgrade: (req, socket, head) => void ws.handleUpgrade(req, socket, head) });
  const httpPort = await listen(server, opts.http.port, opts.http.host);
  if (opts.timers !== false) hub.start();

  let demo: DemoRigHandle | undefined;
  if (opts.demo) {
    demo = await startDemoRig({ url: mqttUrl, credentials: demoCredentials, clock, logger, seed: opts.demo.seed });
  }

  return {
    httpPort,
    mqttPort: broker?.port,
    mqttUrl,
    bus,
    pipeline,
    ingest,
    faults,
    hub,
    configs,
    broker,
    devices,
    demo,
    leases,
    health,
    overview,
    async close() {
      await leases?.close();
      hub.stop();
      await demo?.stop().catch((err: unknown) => logger.warn(`demo rig did not stop cleanly: ${errorMessage(err)}`));
      await ws.close();
      server.closeAllConnections();
      await new Promise<void>((resolve) => server.close(() => resolve()));
      await bus.close();
      await broker?.close();
    },
  };
}

/**
 * Acks as the embedded broker sees them, with the authenticated identity of the client that
 * published each one (aedes' publish event carries the client), so the exchange can bind them to devices.
 */
function embeddedAckFeed(broker: EmbeddedBroker, principalOf: DeviceAuth["principalOf"]): AckFeed {
  return async (handler) => {
    broker.broker.on("publish", (packet, client) => {
      if (parseTopic(packet.topic)?.kind !== "ack") return;
      const p = principalOf(client);
      const payload = typeof packet.payload === "string" ? Buffer.from(packet.payload) : packet.payload;
      handler(packet.topic, payload, p?.kind === "device" ? p : null);
    });
  };
}
