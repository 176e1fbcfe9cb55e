import { readFileSync } from "node:fs";
import { createDb } from "@/db/client";
import { SESSION_TTL_SECONDS } from "@/lib/auth/session-config";
import { appOrigin, appUrl, env } from "@/lib/env";
import { demoDeviceCredential } from "@/lib/demo/device-credentials";
import { localSidecarWsUrl, MAX_CANDIDATES_PER_CLIENT } from "@/lib/protocol";
import { createWorkPool, poolSettings, workerEntry } from "@/lib/workers";
import { startAlarms, type AlarmService } from "./alarms/service";
import { consoleLogger, systemClock } from "./clock";
import { startLeadership, type Leadership } from "./cluster/leader";
import { startDemoRig } from "./demo-rig/rig";
import { startDeploymentWorker } from "./deploy/worker";
import { smtpTransport, startOutboxSender } from "./mail/outbox-sender";
import { startSidecar, type Sidecar } from "./sidecar";
import { errorMessage } from "@/lib/errors";

/** Composition root: reads the environment once and starts the sidecar; SIGTERM/SIGINT stop it cleanly. */
const e = env();
const db = createDb(e.DATABASE_URL);
const loopback = "127.0.0.1";
// Candidates are designed on worker threads with a time limit, so no design can stall ingest or the stream;
// a connection may design all of its candidates at once (the bench sends them together when it connects).
const work = createWorkPool({
  ...poolSettings(),
  maxPerOwner: MAX_CANDIDATES_PER_CLIENT,
  entry: workerEntry(),
  log: (m) => consoleLogger.warn(`design threads: ${m}`),
});

let sidecar: Sidecar | undefined;
let leadership: Leadership | undefined;
let alarms: AlarmService | undefined;
let stopping = false;

async function shutdown(signal: string): Promise<void> {
  if (stopping) return;
  stopping = true;
  consoleLogger.info(`${signal}: shutting down`);
  const force = setTimeout(() => process.exit(1), 5000);
  force.unref();
  try {
    await leadership?.close();
    await alarms?.stop();
    await sidecar?.close();
    await work.close();
    await db.destroy();
    process.exit(0);
  } catch (err) {
    consoleLogger.warn(`shutdown failed: ${errorMessage(err)}`);
    process.exit(1);
  }
}
process.on("SIGTERM", () => void shutdown("SIGTERM"));
process.on("SIGINT", () => void shutdown("SIGINT"));

if (e.SIDECAR_ID && !e.MQTT_URL) {
  consoleLogger.warn("SIDECAR_ID partitions channels across sidecars sharing an external broker: set MQTT_URL as well.");
  process.exit(1);
}
// Partitioned (docs/scale-out.md): this sidecar filters the channels it holds leases on.
const leases = e.SIDECAR_ID
  ? { id: e.SIDECAR_ID, wsUrl: e.SIDECAR_WS_URL ?? localSidecarWsUrl(e.SIDECAR_PORT), ttlMs: e.LEASE_TTL_MS, heartbeatMs: e.LEASE_HEARTBEAT_MS }
  : undefined;

if (!e.MQTT_URL && e.REQUIRE_DEVICE_AUTH === "0") {
  consoleLogger.warn(
    "!!! REQUIRE_DEVICE_AUTH=0: the embedded MQTT broker accepts ANY client without credentials. Anyone who can reach " +
      `port ${e.MQTT_PORT} can read every signal, inject samples and acknowledge deployments. Use this for development only. !!!`,
  );
}

sidecar = await startSidecar({
  db,
  clock: systemClock,
  logger: consoleLogger,
  sessionSecret: e.SESSION_SECRET,
  sessionTtlSeconds: SESSION_TTL_SECONDS,
  http: {
    host: loopback,
    port: e.SIDECAR_PORT,
    allowedOrigins: [...new Set([appOrigin(e), `http://127.0.0.1:${e.PORT}`, `http://localhost:${e.PORT}`])],
  },
  design: (spec, owner) => work.run({ kind: "live-design", spec }, owner),
  ws: {
    messageRate: { perSecond: e.WS_MESSAGES_PER_SECOND, burst: e.WS_MESSAGE_BURST },
    maxConnectionsPerUser: e.WS_CONNECTIONS_PER_USER,
    metricsPerSecond: e.LIVE_METRICS_PER_SECOND,
  },
  mqtt: e.MQTT_URL
    ? {
        mode: "external",
        url: e.MQTT_URL,
        username: e.MQTT_USERNAME,
        password: e.MQTT_PASSWORD,
        ca: e.MQTT_CA_FILE ? readFileSync(e.MQTT_CA_FILE) : undefined,
        sharedGroup: e.SHARED_GROUP,
      }
    : {
        mode: "embedded",
        host: loopback,
        port: e.MQTT_PORT,
        requireDeviceAuth: e.REQUIRE_DEVICE_AUTH === "1",
        internal: e.MQTT_USERNAME && e.MQTT_PASSWORD ? [{ username: e.MQTT_USERNAME, password: e.MQTT_PASSWORD }] : [],
      },
  republishFiltered: e.REPUBLISH_FILTERED === "1",
  leases,
  // Partitioned, the demo rig is lab-wide work: the leading sidecar runs it (below).
  demo: e.DEMO === "1" && !leases ? { seed: e.DEMO_SEED } : undefined,
});
const started = sidecar;

// Lab-wide work runs on one sidecar at a time (a PostgreSQL advisory lock; with one sidecar, this one):
// promotion — pending deployments go to devices through the config exchange, acknowledged ones switch
// the production slot — with the reconciliation of retained configs, and the mail outbox, whose
// notifications (written with their event) are delivered with retries.
leadership = startLeadership({
  databaseUrl: e.DATABASE_URL,
  clock: systemClock,
  logger: consoleLogger,
  async lead() {
    const deployments = await startDeploymentWorker({
      db,
      databaseUrl: e.DATABASE_URL,
      exchange: started.configs,
      bus: started.bus,
      // Partitioned, each sidecar picks up its channels' production filters at its next lease round.
      pipeline: leases ? undefined : started.pipeline,
      // Open benches follow (partitioned, the channel's owner tells its own subscribers when it switches).
      onProductionChange: leases
        ? undefined
        : (channel, revisionId) => started.hub.toSubscribers(channel, { type: "production-changed", channel, revisionId }),
      clock: systemClock,
      logger: consoleLogger,
      ackTimeoutMs: e.DEPLOY_ACK_TIMEOUT_MS,
    });
    const outbox = startOutboxSender({
      db,
      transport: smtpTransport("127.0.0.1", e.SMTP_PORT),
      from: e.MAIL_FROM,
      appUrl: appUrl(e),
      clock: systemClock,
      logger: consoleLogger,
    });
    const demo =
      leases && e.DEMO === "1"
        ? await startDemoRig({
            url: started.mqttUrl,
            credentials: (rig, device) => demoDeviceCredential(e.SESSION_SECRET, rig, device),
            clock: systemClock,
            logger: consoleLogger,
            seed: e.DEMO_SEED,
          })
        : undefined;
    return {
      async stop() {
        await demo?.stop();
        await outbox.stop();
        await deployments.stop();
      },
    };
  },
});
await leadership.attempt();

// Alarms: rules run on every sample after the production filter; events are stored (buffered through a database outage) and pushed.
alarms = await startAlarms({ db, databaseUrl: e.DATABASE_URL, pipeline: sidecar.pipeline, hub: sidecar.hub, clock: systemClock, logger: consoleLogger });

consoleLogger.info(
  `listening on http://${loopback}:${sidecar.httpPort} (health: /health, WebSocket: /ws); MQTT ${sidecar.mqttUrl}`,
);
