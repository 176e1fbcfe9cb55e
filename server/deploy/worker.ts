import type { Db } from "@/db/client";
import { listDevices, listDevicesWithPendingDeployments } from "@/db/queries/devices";
import { DEPLOY_CHANNEL, findDeployment, listActiveDeployments, listDeviceChannelStates, listPendingDeploymentIds, type DeploymentView } from "@/db/queries/deployments";
import { activateDeployment, failDeployment } from "@/db/workflow/deployments";
import { deployedDesign } from "@/lib/coefficients";
import type { FilterDesign } from "@/lib/dsp";
import { configTopic, type DeviceConfig } from "@/lib/protocol";
import type { MessageBus } from "../broker/bus";
import type { Clock, Logger } from "../clock";
import type { ConfigExchange, ConfigOutcome } from "../devices/config-exchange";
import type { Pipeline } from "../pipeline/pipeline";
import { buildDeviceDocument, type DeviceRef } from "./document";
import { listenForNotifications } from "./listen";
import { errorMessage } from "@/lib/errors";

/** How long a device has to acknowledge a configuration document before the deployment fails (ms). */
export const DEFAULT_ACK_TIMEOUT_MS = 10_000;

export interface DeploymentWorkerDeps {
  db: Db;
  /** Connection string for the worker's own LISTEN connection. */
  databaseUrl: string;
  exchange: ConfigExchange;
  /**
   * Used to retain the documents of what is active: after a failure, at start, and at every
   * (re)connection to the broker (onState), so a device always finds what it last acknowledged.
   */
  bus: Pick<MessageBus, "publish" | "onState">;
  pipeline?: Pick<Pipeline, "setProductionFilter">;
  /** Told of every acknowledged change of a channel's production filter (revision id, null for pass-through). */
  onProductionChange?: (channel: string, revisionId: number | null) => void;
  clock: Clock;
  logger: Logger;
  ackTimeoutMs?: number;
}

export interface DeploymentWorker {
  /** Resolves once no deployment is being handled (tests). */
  idle(): Promise<void>;
  /**
   * Stops listening and taking new work without waiting for acks in flight: a deployment still
   * waiting at shutdown stays pending and is sent again by the sweep at the next start.
   */
  stop(): Promise<void>;
}

function deviceOf(d: DeploymentView): DeviceRef {
  return { id: d.deviceId, rigKey: d.rigKey, key: d.deviceKey };
}

/**
 * The sidecar side of promotion: for every pending deployment (notified on DEPLOY_CHANNEL, and swept
 * at start and after a reconnect) it builds the device's whole configuration document (every channel
 * with its active entry, the deployed channel with the pending one), sends it through the device
 * config exchange and waits for the ack. Documents are serialised per device: one in flight at a
 * time, the next queued behind it, so each is built from what the previous one left active. Applied
 * with the same configId and checksum → active (previous superseded) and the live pipeline's
 * production filter switches; refused or no ack within ackTimeoutMs → failed, the document of what is
 * still active is put back as the retained message and the previous revision stays active.
 */
export async function startDeploymentWorker(deps: DeploymentWorkerDeps): Promise<DeploymentWorker> {
  const timeoutMs = deps.ackTimeoutMs ?? DEFAULT_ACK_TIMEOUT_MS;
  const scheduled = new Set<number>();
  const running = new Set<Promise<void>>();
  /** Per device id: the end of its queue of documents. */
  const queues = new Map<number, Promise<void>>();
  let stopped = false;

  function schedule(id: number): void {
    if (stopped || scheduled.has(id)) return;
    scheduled.add(id);
    const job: Promise<void> = enqueue(id)
      .catch((err: unknown) => deps.logger.warn(`deployment ${id}: ${errorMessage(err)}`))
      .finally(() => {
        scheduled.delete(id);
        running.delete(job);
      });
    running.add(job);
  }

  async function enqueue(id: number): Promise<void> {
    const d = await findDeployment(deps.db, id);
    if (!d || d.state !== "pending") return;
    const turn = (queues.get(d.deviceId) ?? Promise.resolve()).then(() => handle(id));
    // The queue goes on after a failed turn; the failure itself reaches this call's caller below.
    const tail = turn.catch(() => undefined);
    queues.set(d.deviceId, tail);
    try {
      await turn;
    } finally {
      if (queues.get(d.deviceId) === tail) queues.delete(d.deviceId);
    }
  }

  async function sweep(): Promise<void> {
    for (const id of await listPendingDeploymentIds(deps.db)) schedule(id);
  }

  async function handle(id: number): Promise<void> {
    if (stopped) return; // still pending: the next start's sweep sends it
    const d = await findDeployment(deps.db, id);
    if (!d || d.state !== "pending") return;
    let document: DeviceConfig;
    try {
      document = await buildDeviceDocument(deps.db, deviceOf(d), String(d.id), d);
    } catch (err) {
      return fail(d, errorMessage(err));
    }
    deps.logger.info(
      `deployment ${id}: sending revision ${d.revisionId} to ${d.channel} (${d.format}, ${d.checksum.slice(0, 12)}…) in config ${document.configId}`,
    );
    let outcome: ConfigOutcome;
    try {
      outcome = await deps.exchange.send(d.rigKey, d.deviceKey, document, timeoutMs);
    } catch (err) {
      return fail(d, `the config could not be published: ${errorMessage(err)}`);
    }
    if (outcome.status === "timeout") return fail(d, `no acknowledgement from ${d.rigKey}/${d.deviceKey} within ${timeoutMs / 1000} s`);
    if (outcome.status === "refused") return fail(d, `the device refused it: ${outcome.ack.reason ?? "no reason given"}`);
    const active = await deps.db.transaction().execute((trx) => activateDeployment(trx, id));
    if (!active) return;
    const design = applyToPipeline(active);
    deps.onProductionChange?.(active.channel, design === null ? null : active.revisionId);
  }

  /** Fails the deployment and retains the document of what is still active. */
  async function fail(d: DeploymentView, reason: string): Promise<void> {
    deps.logger.warn(`deployment ${d.id} failed: ${reason}`);
    const failed = await deps.db.transaction().execute((trx) => failDeployment(trx, d.id, reason));
    if (!failed) return;
    await retainActive(deviceOf(d)).catch((err: unknown) =>
      deps.logger.warn(`deployment ${d.id}: previous config not put back: ${errorMessage(err)}`),
    );
  }

  /**
   * Retains a device's document of what is active in the database. Its configId names the active
   * deployments (`active-<ids>`, `active-none` for pass-through everywhere), so publishing it again
   * for an unchanged database publishes the same document: idempotent.
   */
  async function retainActive(device: DeviceRef): Promise<void> {
    const ids = (await listDeviceChannelStates(deps.db, device.id)).flatMap((c) => (c.active ? [c.active.id] : []));
    const configId = ids.length === 0 ? "active-none" : `active-${ids.sort((a, b) => a - b).join("-")}`;
    const document = await buildDeviceDocument(deps.db, device, configId.slice(0, 64), null);
    await deps.bus.publish(configTopic(device.rigKey, device.key), JSON.stringify(document), { retain: true, qos: 1 });
  }

  /**
   * The database is the truth devices are brought back to: every device without a deployment in
   * flight gets its active document retained again (the sweep sends the others theirs).
   */
  async function reconcile(): Promise<void> {
    const pending = await listDevicesWithPendingDeployments(deps.db);
    for (const device of await listDevices(deps.db)) {
      if (stopped) return;
      if (pending.has(device.id)) continue;
      await retainActive(device).catch((err: unknown) =>
        deps.logger.warn(`config of ${device.rigKey}/${device.key} not republished: ${errorMessage(err)}`),
      );
    }
  }

  function logged(what: string, work: Promise<void>): void {
    work.catch((err: unknown) => deps.logger.warn(`${what} failed: ${errorMessage(err)}`));
  }

  /** Switches the live production slot to what the device acknowledged; returns that design (null: pass-through). */
  function applyToPipeline(d: DeploymentView): FilterDesign | null {
    try {
      const design = deployedDesign(d);
      deps.pipeline?.setProductionFilter(d.channel, String(d.revisionId), design);
      return design;
    } catch (err) {
      deps.logger.warn(`production filter for ${d.channel} not switched: ${errorMessage(err)}`);
      return null;
    }
  }

  for (const d of await listActiveDeployments(deps.db)) applyToPipeline(d);
  const listener = await listenForNotifications({
    databaseUrl: deps.databaseUrl,
    channel: DEPLOY_CHANNEL,
    onNotify: (payload) => {
      const id = Number(payload);
      if (Number.isInteger(id) && id > 0) schedule(id);
    },
    onReconnect: () => logged("sweep after a database reconnect", sweep()),
    clock: deps.clock,
    logger: deps.logger,
  });
  await sweep();
  await reconcile();
  deps.bus.onState((state) => {
    if (state === "connected") logged("republishing the active configs after a broker reconnect", reconcile());
  });

  return {
    async idle() {
      while (running.size) await Promise.all(running);
    },
    async stop() {
      stopped = true;
      await listener.close();
    },
  };
}
