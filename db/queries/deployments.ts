import { sql, type Transaction } from "kysely";
import type { StoredChannelConfig } from "@/lib/coefficients";
import type { FilterDesign, FilterSpec } from "@/lib/dsp";
import { AppError } from "@/lib/errors";
import type { ActiveDeploymentRef } from "@/lib/workflow/deployment";
import type { Db } from "../client";
import type { Database, DeploymentKind } from "../types";
import { readChannelConfig, readDesign, readSpec } from "../json-columns";
import { channelPathSql } from "./channels";


/** Channel the sidecar's deployment worker LISTENs on; the payload is the deployment id. */
export const DEPLOY_CHANNEL = "tapwright_deploy";

const pathExpr = channelPathSql("rg", "d", "c");

/** Whether a stored entry has no stages (chains store `stages`, entries from before chains `sections`). */
function passThroughSql(config: "p.config" | "config") {
  return sql<boolean>`jsonb_array_length(coalesce(${sql.ref(config)} -> 'stages', ${sql.ref(config)} -> 'sections')) = 0`;
}

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
      passThroughSql("p.config").as("passThrough"),
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

function isUniqueViolation(err: unknown): boolean {
  return typeof err === "object" && err !== null && "code" in err && err.code === "23505";
}

/**
 * Records a pending deployment and notifies the worker (DEPLOY_CHANNEL) in the caller's transaction;
 * 409 when the channel already has one waiting for its device.
 */
export async function insertPendingDeployment(
  trx: Transaction<Database>,
  values: {
    revisionId: number;
    channel: { id: number; path: string };
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

/** A channel's active deployment, just what a promotion or a rollback checks (one table, no stored entry). */
export function findActiveDeploymentRef(db: Db, channelId: number): Promise<ActiveDeploymentRef | undefined> {
  return db
    .selectFrom("deployments")
    .select(["id", "revision_id as revisionId", "previous_id as previousId", passThroughSql("config").as("passThrough")])
    .where("channel_id", "=", channelId)
    .where("state", "=", "active")
    .executeTakeFirst();
}

/** What a deployment sent: its revision, stored entry and checksum. */
export async function findDeploymentEntry(db: Db, id: number): Promise<{ revisionId: number; config: StoredChannelConfig; checksum: string } | undefined> {
  const row = await db.selectFrom("deployments").select(["revision_id as revisionId", "config", "checksum"]).where("id", "=", id).executeTakeFirst();
  return row && { ...row, config: readChannelConfig(row.config, { table: "deployments", id }) };
}

/** Locks a deployment's row for the rest of the transaction; undefined when there is none. */
export function lockDeployment(trx: Transaction<Database>, id: number) {
  return trx.selectFrom("deployments").select(["state", "channel_id as channelId", "kind"]).where("id", "=", id).forUpdate().executeTakeFirst();
}

/** Ends a channel's active deployment (superseded or rolled back); returns it, if there was one. */
export function endActiveDeployment(trx: Transaction<Database>, channelId: number, state: "superseded" | "rolled_back") {
  return trx
    .updateTable("deployments")
    .set({ state, ended_at: sql`now()` })
    .where("channel_id", "=", channelId)
    .where("state", "=", "active")
    .returning(["id", "revision_id as revisionId"])
    .executeTakeFirst();
}

export async function markDeploymentActive(trx: Transaction<Database>, id: number): Promise<void> {
  await trx.updateTable("deployments").set({ state: "active", activated_at: sql`now()` }).where("id", "=", id).execute();
}

export async function markDeploymentFailed(trx: Transaction<Database>, id: number, reason: string): Promise<void> {
  await trx.updateTable("deployments").set({ state: "failed", ended_at: sql`now()`, reason }).where("id", "=", id).execute();
}

/** Per channel: the active revision's label and whether a deployment is pending (the promote form). */
export async function channelDeploymentStates(db: Db, channelIds: number[]): Promise<Map<number, { active: string | null; pending: boolean }>> {
  const out = new Map(channelIds.map((id) => [id, { active: null as string | null, pending: false }]));
  if (channelIds.length === 0) return out;
  const rows = await db
    .selectFrom("deployments as p")
    .innerJoin("revisions as r", "r.id", "p.revision_id")
    .innerJoin("coefficient_sets as s", "s.id", "r.set_id")
    .select(["p.channel_id as channelId", "p.state", "s.name as setName", "r.revision", passThroughSql("p.config").as("passThrough")])
    .where("p.channel_id", "in", channelIds)
    .where("p.state", "in", ["active", "pending"])
    .execute();
  for (const r of rows) {
    const entry = out.get(r.channelId)!;
    if (r.state === "pending") entry.pending = true;
    else if (!r.passThrough) entry.active = `${r.setName} r${r.revision}`;
  }
  return out;
}
