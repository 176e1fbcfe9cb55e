import { sql, type Transaction } from "kysely";
import type { RevisionContent } from "@/lib/coefficients";
import type { FilterSpec } from "@/lib/dsp";
import { AppError } from "@/lib/errors";
import { decide, type SetStatus } from "@/lib/workflow";
import type { SetListItem } from "@/lib/workflow/set-list";
import type { SessionUser } from "@/lib/auth/guard";
import type { Db } from "../client";
import type { CoefficientFormat, Database } from "../types";
import { appendAudit } from "./audit";
import { channelPathSql } from "./channels";


export interface NewRevisionInput {
  spec: FilterSpec;
  content: RevisionContent;
  notes: string;
  format: CoefficientFormat;
  sampleRateHz: number;
}

export interface SavedRevision {
  setId: number;
  revisionId: number;
  revision: number;
}

/** Throws the workflow rule's refusal as an AppError (403 or 409). */
export function enforce(decision: ReturnType<typeof decide>): void {
  if (!decision.ok) throw new AppError(decision.code, decision.reason);
}

async function insertRevision(trx: Transaction<Database>, setId: number, revision: number, authorId: number, input: NewRevisionInput) {
  return trx
    .insertInto("revisions")
    .values({
      set_id: setId,
      revision,
      spec: JSON.stringify(input.spec),
      design: JSON.stringify(input.content.design),
      device_format: input.format,
      quantized: JSON.stringify(input.content.quantized),
      analysis: JSON.stringify(input.content.analysis),
      sample_rate_hz: input.sampleRateHz,
      author_id: authorId,
      notes: input.notes,
    })
    .returning("id")
    .executeTakeFirstOrThrow();
}

function revisionAudit(setId: number, revision: number, input: NewRevisionInput) {
  return { setId, revision, spec: input.spec, notes: input.notes, format: input.format, deployable: input.content.analysis.deployable };
}

/** Creates a set on a channel with its first (draft) revision. */
export async function createSet(
  trx: Transaction<Database>,
  actor: SessionUser,
  channelId: number,
  name: string,
  input: NewRevisionInput,
): Promise<SavedRevision> {
  enforce(decide("create_set", { role: actor.role, actorId: actor.id }));
  const set = await trx
    .insertInto("coefficient_sets")
    .values({ channel_id: channelId, name, created_by: actor.id, latest_revision: 1 })
    .returning("id")
    .executeTakeFirstOrThrow();
  const rev = await insertRevision(trx, set.id, 1, actor.id, input);
  await appendAudit(trx, { actorId: actor.id, action: "set.create", entity: "set", entityId: set.id, after: { name, channelId } });
  await appendAudit(trx, { actorId: actor.id, action: "revision.create", entity: "revision", entityId: rev.id, after: revisionAudit(set.id, 1, input) });
  return { setId: set.id, revisionId: rev.id, revision: 1 };
}

/** Adds the next revision; 409 when `expectedLatestRevision` is no longer the latest (someone saved first). */
export async function addRevision(
  trx: Transaction<Database>,
  actor: SessionUser,
  setId: number,
  expectedLatestRevision: number,
  input: NewRevisionInput,
): Promise<SavedRevision> {
  const set = await trx.selectFrom("coefficient_sets").selectAll().where("id", "=", setId).forUpdate().executeTakeFirst();
  if (!set) throw new AppError("not_found", "No such coefficient set.");
  enforce(decide("save_revision", { role: actor.role, actorId: actor.id, retired: set.retired_at !== null }));
  if (set.latest_revision !== expectedLatestRevision) {
    throw new AppError(
      "conflict",
      `This set has moved on: its latest revision is r${set.latest_revision}, you edited from r${expectedLatestRevision}. Reload and save again.`,
    );
  }
  const revision = set.latest_revision + 1;
  const rev = await insertRevision(trx, setId, revision, actor.id, input);
  await trx
    .updateTable("coefficient_sets")
    .set({ latest_revision: revision, updated_at: sql`now()`, version: sql`version + 1` })
    .where("id", "=", setId)
    .execute();
  await appendAudit(trx, { actorId: actor.id, action: "revision.create", entity: "revision", entityId: rev.id, after: revisionAudit(setId, revision, input) });
  return { setId, revisionId: rev.id, revision };
}

/** Retires a set (no further revisions, reviews or promotions); 409 on a stale version. */
export async function retireSet(trx: Transaction<Database>, actor: SessionUser, setId: number, expectedVersion: number): Promise<void> {
  const set = await trx.selectFrom("coefficient_sets").selectAll().where("id", "=", setId).forUpdate().executeTakeFirst();
  if (!set) throw new AppError("not_found", "No such coefficient set.");
  if (set.version !== expectedVersion) throw new AppError("conflict", "This set changed since you opened it. Reload and try again.");
  enforce(decide("retire", { role: actor.role, actorId: actor.id, retired: set.retired_at !== null }));
  await trx
    .updateTable("coefficient_sets")
    .set({ retired_at: sql`now()`, updated_at: sql`now()`, version: sql`version + 1` })
    .where("id", "=", setId)
    .execute();
  await appendAudit(trx, { actorId: actor.id, action: "set.retire", entity: "set", entityId: setId, before: { retired: false }, after: { retired: true } });
}

const statusExpr = sql<SetStatus>`case when s.retired_at is not null then 'retired' else r.state end`;
const pathExpr = channelPathSql("rg", "d", "c");

function setQuery(db: Db) {
  return db
    .selectFrom("coefficient_sets as s")
    .innerJoin("channels as c", "c.id", "s.channel_id")
    .innerJoin("devices as d", "d.id", "c.device_id")
    .innerJoin("rigs as rg", "rg.id", "d.rig_id")
    .innerJoin("revisions as r", (j) => j.onRef("r.set_id", "=", "s.id").onRef("r.revision", "=", "s.latest_revision"))
    .innerJoin("users as u", "u.id", "s.created_by");
}

export const SET_SORTS = ["name", "channel", "status", "latestRevision", "author", "updatedAt"] as const;
export type SetSort = (typeof SET_SORTS)[number];

export interface SetFilters {
  channel?: string;
  status?: SetStatus;
  author?: string;
  q?: string;
  sort: SetSort;
  dir: "asc" | "desc";
  page: number;
  pageSize: number;
}

const SORT_COLUMN = {
  name: sql`s.name`,
  channel: pathExpr,
  status: statusExpr,
  latestRevision: sql`s.latest_revision`,
  author: sql`u.display_name`,
  updatedAt: sql`s.updated_at`,
} as const;

/** One page of sets, filtered and sorted on the server; `total` counts every match. */
export async function listSets(db: Db, f: SetFilters): Promise<{ items: SetListItem[]; total: number }> {
  let q = setQuery(db);
  if (f.channel) q = q.where(pathExpr, "=", f.channel);
  if (f.status) q = q.where(statusExpr, "=", f.status);
  if (f.author) {
    const needle = `%${escapeLike(f.author)}%`;
    q = /^\d+$/.test(f.author)
      ? q.where("s.created_by", "=", Number(f.author))
      : q.where((eb) => eb.or([eb("u.display_name", "ilike", needle), eb("u.email", "ilike", needle)]));
  }
  if (f.q) {
    const needle = `%${escapeLike(f.q)}%`;
    q = q.where((eb) => eb.or([eb("s.name", "ilike", needle), eb(pathExpr, "ilike", needle)]));
  }
  const { total } = await q.select(sql<string>`count(*)`.as("total")).executeTakeFirstOrThrow();
  const items = await q
    .select([
      "s.id",
      "s.name",
      pathExpr.as("channel"),
      statusExpr.as("status"),
      "s.latest_revision as latestRevision",
      "u.display_name as author",
      "s.updated_at as updatedAt",
    ])
    .orderBy(SORT_COLUMN[f.sort], f.dir)
    .orderBy("s.id", f.dir)
    .limit(f.pageSize)
    .offset((f.page - 1) * f.pageSize)
    .execute();
  return { items, total: Number(total) };
}

export function escapeLike(text: string): string {
  return text.replace(/[\\%_]/g, (c) => `\\${c}`);
}

/** A set with its channel, device format and creator. */
export function findSet(db: Db, id: number) {
  return setQuery(db)
    .select([
      "s.id",
      "s.name",
      "s.version",
      "s.latest_revision as latestRevision",
      "s.retired_at as retiredAt",
      "s.created_at as createdAt",
      "s.updated_at as updatedAt",
      "s.channel_id as channelId",
      pathExpr.as("channel"),
      "c.sample_rate_hz as sampleRateHz",
      "d.coefficient_format as format",
      statusExpr.as("status"),
      "u.display_name as author",
    ])
    .where("s.id", "=", id)
    .executeTakeFirst();
}
