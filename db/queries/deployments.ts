import { sql, type Transaction } from "kysely";
import type { SessionUser } from "@/lib/auth/guard";
import {
  channelConfigChecksum,
  channelConfigEntry,
  currentChannelConfig,
  DeploymentRefusal,
  entryDesign,
  quantizeForTarget,
  type DeploymentTarget,
  type StoredChannelConfig,
} from "@/lib/coefficients";
import type { FilterDesign, FilterSpec } from "@/lib/dsp";
import { AppError } from "@/lib/errors";
import { channelConfigSchema, type ChannelConfig } from "@/lib/protocol";
import { deploymentMail, type DeploymentRef } from "@/lib/mail/templates";
import { decide } from "@/lib/workflow";
import type { Db } from "../client";
import type { Database, DeploymentKind } from "../types";
import { readChannelConfig, readDesign, readSpec } from "../json-columns";
import { appendAudit } from "./audit";
import { channelPathSql, findChannelByPath, type ChannelRow } from "./channels";
import { enqueueMail, leadAddresses, userAddress } from "./mail";
import { findRevision } from "./revisions";
import { enforce } from "./sets";


/** Channel the sidecar's deployment worker LISTENs on; the payload is the deployment id. */
export const DEPLOY_CHANNEL = "tapwright_deploy";

const pathExpr = channelPathSql("rg", "d", "c");

/** Deployments with their channel, revision, set and requester: every column but the JSON ones. */
function summaryQuery(db: Db) {
  return db
    .selectFrom("deployments as p")
    .innerJoin("revisions as r", "r.id", "p.revision_id")
    .innerJoin("coefficient_sets as s", "s.id", "r.set_id")
    .innerJoin("channels as c", "c.id", "p.channel_id")
    .innerJoin("devices as d", "d.id", "c.device_id")
    .innerJoin("rigs as rg", "rg.id", "d.rig_id")
    .innerJoin("users as u", "u.id", "p.requested_by")
    .innerJoin("channels as sc", "sc.id", "s.channel_id")
    .innerJoin("devices as sd", "sd.id", "sc.device_id")
    .innerJoin("rigs as sr", "sr.id", "sd.rig_id")
    .select([
      "p.id",
      "p.kind",
      "p.state",
      "p.format",
      "p.checksum",
      "p.previous_id as previousId",
      "p.requested_at as requestedAt",
      "p.activated_at as activatedAt",
      "p.ended_at as endedAt",
      "p.reason",
      "u.display_name as requestedBy",
      "p.channel_id as channelId",
      pathExpr.as("channel"),
      "rg.key as rigKey",
      "d.id as deviceId",
      "d.key as deviceKey",
      "c.key as channelKey",
      "c.sample_rate_hz as sampleRateHz",
      "r.id as revisionId",
      "r.revision",
      "r.author_id as authorId",
      "s.id as setId",
      "s.name as setName",
      channelPathSql("sr", "sd", "sc").as("setChannel"),
      // No stages in the entry (chains store `stages`, entries from before chains `sections`).
      sql<boolean>`jsonb_array_length(coalesce(p.config -> 'stages', p.config -> 'sections')) = 0`.as("passThrough"),
    ]);
}

/** The summary with the stored channel entry and the revision's spec and design (still unchecked). */
function deploymentQuery(db: Db) {
  return summaryQuery(db).select(["p.config", "r.design", "r.spec"]);
}

type DeploymentRow = Awaited<ReturnType<ReturnType<typeof deploymentQuery>["executeTakeFirstOrThrow"]>>;

/** A deployment row with its JSON columns opened (each checked, see db/json-columns.ts). */
function toView(row: DeploymentRow): DeploymentView {
  const revision = { table: "revisions", id: row.revisionId } as const;
  return {
    ...row,
    config: readChannelConfig(row.config, { table: "deployments", id: row.id }),
    design: readDesign(row.design, revision),
    spec: readSpec(row.spec, revision),
  };
}

/** A deployment as lists show it: no stored entry, spec or design. */
export interface DeploymentSummary {
  id: number;
  kind: DeploymentKind;
  state: "pending" | "active" | "superseded" | "failed" | "rolled_back";
  format: "f32" | "q15" | "q31";
  /** SHA-256 of canonicalJson(config): the content hash of what this channel runs. */
  checksum: string;
  previousId: number | null;
  requestedAt: Date;
  activatedAt: Date | null;
  endedAt: Date | null;
  reason: string | null;
  requestedBy: string;
  channelId: number;
  channel: string;
  rigKey: string;
  deviceId: number;
  deviceKey: string;
  channelKey: string;
  sampleRateHz: number;
  revisionId: number;
  revision: number;
  authorId: number;
  setId: number;
  setName: string;
  /** The set's own channel (a deployment may go to another channel of the same sample rate). */
  setChannel: string;
  /**
   * A return to no filter: the entry has no stages. Such a deployment keeps the revision it removed
   * (revision, set and spec name that one); once active, the channel has no production filter.
   */
  passThrough: boolean;
}

/** A deployment with what it runs: the stored channel entry and the revision's spec and design. */
export interface DeploymentView extends DeploymentSummary {
  /**
   * This channel's entry of the device configuration document as stored: the current form (lib/protocol
   * channelConfigSchema) or, for deployments made before chains, the v2 form (see currentChannelConfig).
   */
  config: StoredChannelConfig;
  design: FilterDesign;
  spec: FilterSpec;
}

export async function findDeployment(db: Db, id: number): Promise<DeploymentView | undefined> {
  const row = await deploymentQuery(db).where("p.id", "=", id).executeTakeFirst();
  return row && toView(row);
}

export function listSetDeployments(db: Db, setId: number): Promise<DeploymentSummary[]> {
  return summaryQuery(db).where("s.id", "=", setId).orderBy("p.id", "desc").execute();
}

export function listChannelDeployments(db: Db, channelId: number, limit = 50): Promise<DeploymentSummary[]> {
  return summaryQuery(db).where("p.channel_id", "=", channelId).orderBy("p.id", "desc").limit(limit).execute();
}

/** The active deployment of a channel: its production filter as the device acknowledged it. */
export async function findActiveDeployment(db: Db, channelId: number): Promise<DeploymentView | undefined> {
  const row = await deploymentQuery(db).where("p.channel_id", "=", channelId).where("p.state", "=", "active").executeTakeFirst();
  return row && toView(row);
}

/** The channel's production filter: its active deployment unless that is a return to no filter. */
export async function findProductionDeployment(db: Db, channelId: number): Promise<DeploymentView | undefined> {
  const active = await findActiveDeployment(db, channelId);
  return active?.passThrough ? undefined : active;
}

export async function listActiveDeployments(db: Db): Promise<DeploymentView[]> {
  return (await deploymentQuery(db).where("p.state", "=", "active").execute()).map(toView);
}

/** The revision each active deployment carries, with its set (no stored entries read). */
export function listActiveRevisions(db: Db): Promise<{ revisionId: number; setId: number; setName: string; revision: number }[]> {
  return db
    .selectFrom("deployments as p")
    .innerJoin("revisions as r", "r.id", "p.revision_id")
    .innerJoin("coefficient_sets as s", "s.id", "r.set_id")
    .select(["r.id as revisionId", "s.id as setId", "s.name as setName", "r.revision"])
    .where("p.state", "=", "active")
    .execute();
}

/** A channel of a device with its active deployment, if any (what the device runs once it acknowledged). */
export interface DeviceChannelState {
  channelId: number;
  channelKey: string;
  active: { id: number; config: StoredChannelConfig; checksum: string } | null;
}

/** Every channel of a device, ordered by key, each with its active deployment's config entry. */
export async function listDeviceChannelStates(db: Db, deviceId: number): Promise<DeviceChannelState[]> {
  const rows = await db
    .selectFrom("channels as c")
    .leftJoin("deployments as p", (join) => join.onRef("p.channel_id", "=", "c.id").on("p.state", "=", "active"))
    .select(["c.id as channelId", "c.key as channelKey", "p.id as deploymentId", "p.config", "p.checksum"])
    .where("c.device_id", "=", deviceId)
    .orderBy("c.key")
    .execute();
  return rows.map((r) => ({
    channelId: r.channelId,
    channelKey: r.channelKey,
    active:
      r.deploymentId === null || r.config === null || r.checksum === null
        ? null
        : { id: r.deploymentId, config: readChannelConfig(r.config, { table: "deployments", id: r.deploymentId }), checksum: r.checksum },
  }));
}

export async function listPendingDeploymentIds(db: Db): Promise<number[]> {
  const rows = await db.selectFrom("deployments").select("id").where("state", "=", "pending").orderBy("id").execute();
  return rows.map((r) => r.id);
}

function targetOf(ch: ChannelRow): DeploymentTarget {
  return {
    label: `${ch.deviceKey}/${ch.key}`,
    sampleRateHz: ch.sampleRateHz,
    format: ch.coefficientFormat,
    capacity: { maxSections: ch.maxSections, maxFirTaps: ch.maxFirTaps },
  };
}

/**
 * The production filter the sidecar runs for a deployment: exactly what its device acknowledged, the
 * stored channel entry's coefficients at their real values (a chain for several stages); null for a
 * unit filter.
 */
export function deployedDesign(d: Pick<DeploymentView, "config" | "design">): FilterDesign | null {
  return entryDesign(currentChannelConfig(d.config), d.design);
}

function isUniqueViolation(err: unknown): boolean {
  return typeof err === "object" && err !== null && (err as { code?: unknown }).code === "23505";
}

async function insertPending(
  trx: Transaction<Database>,
  values: {
    revisionId: number;
    channel: ChannelRow;
    kind: DeploymentKind;
    config: StoredChannelConfig;
    checksum: string;
    previousId: number | null;
    actorId: number;
  },
): Promise<number> {
  try {
    const row = await trx
      .insertInto("deployments")
      .values({
        revision_id: values.revisionId,
        channel_id: values.channel.id,
        kind: values.kind,
        format: values.config.format,
        config: JSON.stringify(values.config),
        checksum: values.checksum,
        previous_id: values.previousId,
        requested_by: values.actorId,
      })
      .returning("id")
      .executeTakeFirstOrThrow();
    await sql`select pg_notify(${DEPLOY_CHANNEL}, ${String(row.id)})`.execute(trx);
    return row.id;
  } catch (err) {
    if (isUniqueViolation(err)) {
      throw new AppError("conflict", `A deployment to ${values.channel.path} is already waiting for its device. Wait for it to finish, then try again.`);
    }
    throw err;
  }
}

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
  const locked = await trx.selectFrom("revisions").select("id").where("id", "=", revisionId).forShare().executeTakeFirst();
  if (!locked) throw new AppError("not_found", "No such revision.");
  const rev = (await findRevision(trx, revisionId))!;
  enforce(decide("promote", { role: actor.role, actorId: actor.id, authorId: rev.authorId, state: rev.state, retired: rev.retiredAt !== null }));
  const deployments: PromotionResult["deployments"] = [];
  for (const path of [...new Set(channelPaths)]) {
    const channel = await findChannelByPath(trx, path);
    if (!channel) throw new AppError("not_found", `No channel ${path}.`);
    let config: StoredChannelConfig;
    try {
      const target = targetOf(channel);
      config = channelConfigEntry(String(rev.id), target, quantizeForTarget(rev, target));
    } catch (err) {
      if (err instanceof DeploymentRefusal) throw new AppError("unprocessable", `Refused for ${path}: ${err.message}.`);
      throw err;
    }
    const active = await findActiveDeployment(trx, channel.id);
    const checksum = await channelConfigChecksum(config);
    const id = await insertPending(trx, { revisionId: rev.id, channel, kind: "promote", config, checksum, previousId: active?.id ?? null, actorId: actor.id });
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
  const active = await findActiveDeployment(trx, channel.id);
  if (!active || active.id !== expectedActiveId) {
    throw new AppError("conflict", `The active filter on ${channelPath} changed since you looked. Reload and try again.`);
  }
  if (active.passThrough) throw new AppError("conflict", `${channelPath} already runs no filter; promote a revision to filter it again.`);
  const previous = active.previousId === null ? undefined : await findDeployment(trx, active.previousId);
  const { config, checksum } = previous ?? (await passThroughOf(active));
  const id = await insertPending(trx, { revisionId: previous?.revisionId ?? active.revisionId, channel, kind: "rollback", config, checksum, previousId: active.id, actorId: actor.id });
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

/** The entry that runs no filter on a deployment's channel (its format and rate, an empty stage list) and its checksum. */
async function passThroughOf(d: DeploymentView): Promise<{ config: ChannelConfig; checksum: string }> {
  const config = channelConfigSchema.parse({ ...currentChannelConfig(d.config), stages: [] });
  return { config, checksum: await channelConfigChecksum(config) };
}

function refOf(d: DeploymentView): DeploymentRef {
  return { setId: d.setId, setName: d.setName, revision: d.revision, channel: d.setChannel, target: d.channel };
}

async function notifyOutcome(trx: Transaction<Database>, d: DeploymentView, outcome: "promoted" | "failed" | "rolled_back", detail: string) {
  const to = [...(await userAddress(trx, d.authorId)), ...(await leadAddresses(trx))];
  await enqueueMail(trx, to, deploymentMail(refOf(d), outcome, detail));
}

/**
 * A matching ack arrived: the pending deployment becomes active and the channel's previous active one
 * superseded (rolled back, for a rollback), in one transaction with the audit entry and the mail.
 * Returns null when the deployment is no longer pending (already handled).
 */
export async function activateDeployment(trx: Transaction<Database>, id: number): Promise<DeploymentView | null> {
  const row = await trx.selectFrom("deployments").select(["state", "channel_id", "kind"]).where("id", "=", id).forUpdate().executeTakeFirst();
  if (!row || row.state !== "pending") return null;
  const before = await trx
    .updateTable("deployments")
    .set({ state: row.kind === "rollback" ? "rolled_back" : "superseded", ended_at: sql`now()` })
    .where("channel_id", "=", row.channel_id)
    .where("state", "=", "active")
    .returning(["id", "revision_id"])
    .executeTakeFirst();
  await trx.updateTable("deployments").set({ state: "active", activated_at: sql`now()` }).where("id", "=", id).execute();
  const d = (await findDeployment(trx, id))!;
  await appendAudit(trx, {
    actorId: null,
    action: row.kind === "rollback" ? "deployment.rolled_back" : "deployment.activate",
    entity: "deployment",
    entityId: id,
    before: before ? { activeDeployment: before.id, revisionId: before.revision_id } : null,
    after: { activeDeployment: id, revisionId: d.revisionId, channel: d.channel, checksum: d.checksum, acknowledged: true, ...(d.passThrough ? { passThrough: true } : {}) },
  });
  await notifyOutcome(trx, d, row.kind === "rollback" ? "rolled_back" : "promoted", `Checksum ${d.checksum}.`);
  return d;
}

/** No matching ack (timeout or refusal): the deployment fails and the previous active one stays. */
export async function failDeployment(trx: Transaction<Database>, id: number, reason: string): Promise<DeploymentView | null> {
  const row = await trx.selectFrom("deployments").select("state").where("id", "=", id).forUpdate().executeTakeFirst();
  if (!row || row.state !== "pending") return null;
  await trx.updateTable("deployments").set({ state: "failed", ended_at: sql`now()`, reason }).where("id", "=", id).execute();
  const d = (await findDeployment(trx, id))!;
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

/** Per channel: the active revision's label and whether a deployment is pending (the promote form). */
export async function channelDeploymentStates(db: Db, channelIds: number[]): Promise<Map<number, { active: string | null; pending: boolean }>> {
  const out = new Map(channelIds.map((id) => [id, { active: null as string | null, pending: false }]));
  if (channelIds.length === 0) return out;
  const rows = await deploymentQuery(db).where("p.channel_id", "in", channelIds).where("p.state", "in", ["active", "pending"]).execute();
  for (const r of rows) {
    const entry = out.get(r.channelId)!;
    if (r.state === "pending") entry.pending = true;
    else if (!r.passThrough) entry.active = `${r.setName} r${r.revision}`;
  }
  return out;
}
