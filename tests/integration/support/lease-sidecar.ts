/**
 * One partitioned sidecar as its own process, for the lease tests (they SIGKILL it to see its channels
 * move). Run: node --import tsx lease-sidecar.ts <database-url> <mqtt-url> <sidecar-id> <http-port> <session-secret> [bench].
 * It reports over IPC: "ready", and every batch it filters ({ path, seq, production }) so the test can
 * check no channel is filtered by two sidecars at once; the lab-wide work runs under the leader lock.
 * With `bench` (npm run bench) it reports no batches and lets one client send candidates for every channel at once.
 */
import { createDb } from "@/db/client";
import { startLeadership } from "@/server/cluster/leader";
import { systemClock, type Logger } from "@/server/clock";
import { startDeploymentWorker } from "@/server/deploy/worker";
import { startSidecar } from "@/server/sidecar";
import { sharedDesigns } from "./shared-designs";

const [databaseUrl, mqttUrl, id, port, secret, mode] = process.argv.slice(2);
const bench = mode === "bench";
const logger: Logger = { info: (m) => process.send?.({ type: "log", id, m }), warn: (m) => process.send?.({ type: "log", id, m }) };
const db = createDb(databaseUrl, 4);
const sidecar = await startSidecar({
  db,
  clock: systemClock,
  logger,
  sessionSecret: secret,
  sessionTtlSeconds: 3600,
  http: { host: "127.0.0.1", port: Number(port) },
  mqtt: { mode: "external", url: mqttUrl, backoffMs: { initial: 50, max: 500 } },
  republishFiltered: false,
  design: sharedDesigns(),
  leases: { id, wsUrl: `ws://127.0.0.1:${port}/ws`, ttlMs: 5000, heartbeatMs: 1000 },
  ws: bench ? { messageRate: { perSecond: 1e6, burst: 1e6 } } : undefined,
});
if (!bench) {
  sidecar.pipeline.onSamples((path, batch) => {
    process.send?.({ type: "filtered", id, path, seq: batch.seq, production: sidecar.pipeline.productionRevision(path), at: Date.now() });
  });
}
const leadership = startLeadership({
  databaseUrl,
  clock: systemClock,
  logger,
  retryMs: 500,
  lead: () =>
    startDeploymentWorker({ db, databaseUrl, exchange: sidecar.configs, bus: sidecar.bus, clock: systemClock, logger, ackTimeoutMs: 5000 }),
});
await leadership.attempt();
process.on("message", (m: { type: string }) => {
  if (m.type === "leading?") process.send?.({ type: "leading", id, leading: leadership.leading });
  if (m.type === "stop") void leadership.close().then(() => sidecar.close()).then(() => db.destroy()).then(() => process.exit(0));
});
process.send?.({ type: "ready", id });
