import type { Db } from "@/db/client";
import { findProductionDeployment } from "@/db/queries/deployments";
import { deployedDesign } from "@/lib/coefficients";
import { activeRevisionIds, type LeasedChannel } from "@/db/queries/leases";
import { samplesTopic } from "@/lib/protocol";
import type { MessageBus } from "../broker/bus";
import type { Clock, Logger } from "../clock";
import type { Ingest } from "../ingest/ingest";
import type { Pipeline } from "../pipeline/pipeline";
import type { Hub } from "../ws/hub";
import { createLeaseKeeper, type LeaseKeeper } from "./lease-keeper";

export interface LeaseSettings {
  id: string;
  wsUrl: string;
  ttlMs: number;
  heartbeatMs: number;
}

/**
 * This sidecar's part of a partitioned deployment: a lease keeper whose channels are started with a
 * plain subscription to their samples topic and the production filter the database holds (at steady
 * state from the first sample), and stopped by unsubscribing and clearing them; subscribers of a
 * stopped channel are told it moved. Promotions acknowledged through another sidecar reach the
 * production slot at the next round.
 */
export function partitionChannels(deps: {
  db: Db;
  bus: MessageBus;
  pipeline: Pipeline;
  ingest: Ingest;
  hub: Hub;
  leases: LeaseSettings;
  clock: Clock;
  logger: Logger;
}): LeaseKeeper {
  const { db, bus, pipeline, ingest } = deps;

  async function applyProduction(channel: LeasedChannel): Promise<void> {
    const active = await findProductionDeployment(db, channel.channelId);
    const revision = active ? String(active.revisionId) : null;
    if (revision === pipeline.productionRevision(channel.path)) return;
    pipeline.setProductionFilter(channel.path, revision ?? "", active ? deployedDesign(active) : null);
    // Open benches of this channel reload its production filter (its promotion was acknowledged through the leader).
    deps.hub.toSubscribers(channel.path, { type: "production-changed", channel: channel.path, revisionId: active ? active.revisionId : null });
  }

  return createLeaseKeeper({
    db,
    ...deps.leases,
    clock: deps.clock,
    logger: deps.logger,
    async start(channel) {
      const info = { path: channel.path, sampleRateHz: channel.sampleRateHz };
      pipeline.addChannel(info);
      ingest.addChannel(info);
      pipeline.resetChannel(channel.path);
      await applyProduction(channel);
      await bus.subscribe(samplesTopic(channel.path), (topic, payload) => ingest.handle(topic, payload));
    },
    async stop(path) {
      pipeline.resetChannel(path);
      deps.hub.moved(path);
      await bus.unsubscribe(samplesTopic(path));
    },
    async refresh(held) {
      const active = await activeRevisionIds(db, held.map((c) => c.channelId));
      for (const channel of held) {
        const revision = active.get(channel.channelId);
        if ((revision === undefined ? null : String(revision)) !== pipeline.productionRevision(channel.path)) await applyProduction(channel);
      }
    },
  });
}
