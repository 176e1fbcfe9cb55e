import type { Transaction } from "kysely";
import type { SessionUser } from "@/lib/auth/guard";
import { channelConfigChecksum } from "@/lib/coefficients";
import { AppError } from "@/lib/errors";
import { deploymentMail } from "@/lib/mail/templates";
import { decide } from "@/lib/workflow";
import { activationOutcome, checkRollback, passThroughEntry, promotionEntry } from "@/lib/workflow/deployment";
import { enforce } from "@/lib/workflow/enforce";
import type { Database } from "../types";
import { appendAudit } from "../queries/audit";
import { findChannelByPath } from "../queries/channels";
import {
  endActiveDeployment,
  findActiveDeploymentRef,
  findDeployment,
  findDeploymentEntry,
  insertPendingDeployment,
  lockDeployment,
  markDeploymentActive,
  markDeploymentFailed,
  type DeploymentView,
} from "../queries/deployments";
import { enqueueMail, leadAddresses, userAddress } from "../queries/mail";
import { findRevision, lockRevision } from "../queries/revisions";

export interface PromotionResult {
  deployments: { id: number; channel: string }[];
}

/**
 * Records a pending deployment per target channel and notifies the worker, in the caller's transaction.
 * Refused: not a lead (403), revision not approved or set retired (409), a target that is unknown (404),
 * of another sample rate or unstable once quantized (422), or already has a pending deployment (409).
 */
export async function requestPromotion(
  trx: Transaction<Database>,
  actor: SessionUser,
  revisionId: number,
  channelPaths: string[],
  viaToken?: string,
): Promise<PromotionResult> {
  const locked = await lockRevision(trx, revisionId, "share");
  const rev = locked && (await findRevision(trx, revisionId));
  if (!rev) throw new AppError("not_found", "No such revision.");
  enforce(decide("promote", { role: actor.role, actorId: actor.id, authorId: rev.authorId, state: rev.state, retired: rev.retiredAt !== null }));
  const deployments: PromotionResult["deployments"] = [];
  for (const path of [...new Set(channelPaths)]) {
    const channel = await findChannelByPath(trx, path);
    if (!channel) throw new AppError("not_found", `No channel ${path}.`);
    const config = promotionEntry(rev, channel);
    const active = await findActiveDeploymentRef(trx, channel.id);
    const checksum = await channelConfigChecksum(config);
    const id = await insertPendingDeployment(trx, { revisionId: rev.id, channel, kind: "promote", config, checksum, previousId: active?.id ?? null, actorId: actor.id });
    await appendAudit(trx, {
      actorId: actor.id,
      action: "deployment.request",
      entity: "deployment",
      entityId: id,
      before: active ? { activeDeployment: active.id, revisionId: active.revisionId } : null,
      after: { revisionId: rev.id, setId: rev.setId, revision: rev.revision, channel: path, format: config.format, checksum, ...(viaToken ? { viaToken } : {}) },
    });
    deployments.push({ id, channel: path });
  }
  return { deployments };
}

/**
 * Asks to put the previously active revision back on a channel, through the same acknowledged path;
 * when nothing was active before (the first promotion), the channel returns to no filter: an entry with
 * an empty stage list, acknowledged like any other. `expectedActiveId` is the active deployment the
 * person saw; anything else is a 409, and so is rolling back a channel that already runs no filter.
 */
export async function requestRollback(
  trx: Transaction<Database>,
  actor: SessionUser,
  channelPath: string,
  expectedActiveId: number,
): Promise<{ id: number; channel: string; passThrough: boolean }> {
  enforce(decide("rollback", { role: actor.role, actorId: actor.id }));
  const channel = await findChannelByPath(trx, channelPath);
  if (!channel) throw new AppError("not_found", `No channel ${channelPath}.`);
  const active = checkRollback(await findActiveDeploymentRef(trx, channel.id), expectedActiveId, channelPath);
  const previous = active.previousId === null ? undefined : await findDeploymentEntry(trx, active.previousId);
  const { config, checksum } = previous ?? (await passThroughOf(trx, active.id));
  const id = await insertPendingDeployment(trx, {
    revisionId: previous?.revisionId ?? active.revisionId,
    channel,
    kind: "rollback",
    config,
    checksum,
    previousId: active.id,
    actorId: actor.id,
  });
  await appendAudit(trx, {
    actorId: actor.id,
    action: "deployment.rollback_request",
    entity: "deployment",
    entityId: id,
    before: { activeDeployment: active.id, revisionId: active.revisionId },
    after: previous ? { revisionId: previous.revisionId, channel: channelPath, checksum } : { passThrough: true, channel: channelPath, checksum },
  });
  return { id, channel: channelPath, passThrough: !previous };
}

/** The entry that runs no filter on the channel of the active deployment `activeId`, and its checksum. */
async function passThroughOf(trx: Transaction<Database>, activeId: number) {
  const active = await findDeploymentEntry(trx, activeId);
  if (!active) throw new Error(`deployment ${activeId} vanished inside its transaction`);
  const config = passThroughEntry(active.config);
  return { config, checksum: await channelConfigChecksum(config) };
}

async function notifyOutcome(trx: Transaction<Database>, d: DeploymentView, outcome: "promoted" | "failed" | "rolled_back", detail: string) {
  const to = [...(await userAddress(trx, d.authorId)), ...(await leadAddresses(trx))];
  const ref = { setId: d.setId, setName: d.setName, revision: d.revision, channel: d.setChannel, target: d.channel };
  await enqueueMail(trx, to, deploymentMail(ref, outcome, detail));
}

/** A deployment just changed in this transaction; it is there to read. */
async function changedDeployment(trx: Transaction<Database>, id: number): Promise<DeploymentView> {
  const d = await findDeployment(trx, id);
  if (!d) throw new Error(`deployment ${id} vanished inside its transaction`);
  return d;
}

/**
 * A matching ack arrived: the pending deployment becomes active and the channel's previous active one
 * superseded (rolled back, for a rollback), in one transaction with the audit entry and the mail.
 * Returns null when the deployment is no longer pending (already handled).
 */
export async function activateDeployment(trx: Transaction<Database>, id: number): Promise<DeploymentView | null> {
  const row = await lockDeployment(trx, id);
  if (!row || row.state !== "pending") return null;
  const outcome = activationOutcome(row.kind);
  const before = await endActiveDeployment(trx, row.channelId, outcome.previousEnds);
  await markDeploymentActive(trx, id);
  const d = await changedDeployment(trx, id);
  await appendAudit(trx, {
    actorId: null,
    action: outcome.auditAction,
    entity: "deployment",
    entityId: id,
    before: before ? { activeDeployment: before.id, revisionId: before.revisionId } : null,
    after: { activeDeployment: id, revisionId: d.revisionId, channel: d.channel, checksum: d.checksum, acknowledged: true, ...(d.passThrough ? { passThrough: true } : {}) },
  });
  await notifyOutcome(trx, d, outcome.mail, `Checksum ${d.checksum}.`);
  return d;
}

/** No matching ack (timeout or refusal): the deployment fails and the previous active one stays. */
export async function failDeployment(trx: Transaction<Database>, id: number, reason: string): Promise<DeploymentView | null> {
  const row = await lockDeployment(trx, id);
  if (!row || row.state !== "pending") return null;
  await markDeploymentFailed(trx, id, reason);
  const d = await changedDeployment(trx, id);
  await appendAudit(trx, {
    actorId: null,
    action: "deployment.fail",
    entity: "deployment",
    entityId: id,
    before: { state: "pending" },
    after: { state: "failed", reason, channel: d.channel },
  });
  await notifyOutcome(trx, d, "failed", `Reason: ${reason}`);
  return d;
}
