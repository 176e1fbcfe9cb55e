import { sql, type Transaction } from "kysely";
import type { RevisionContent } from "@/lib/coefficients";
import type { FilterSpec } from "@/lib/dsp";
import type { SetStatus } from "@/lib/workflow";
import type { SetListItem } from "@/lib/workflow/set-list";
import type { Db } from "../client";
import type { CoefficientFormat, Database } from "../types";
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

/** Writes a revision's content (spec, design, quantized form, analysis) as JSON; returns its id. */
export function insertRevision(trx: Transaction<Database>, setId: number, revision: number, authorId: number, input: NewRevisionInput) {
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

/** A new set whose latest revision is 1 (the caller writes that revision); returns its id. */
export function insertSet(trx: Transaction<Database>, set: { channelId: number; name: string; createdBy: number }) {
  return trx
    .insertInto("coefficient_sets")
    .values({ channel_id: set.channelId, name: set.name, created_by: set.createdBy, latest_revision: 1 })
    .returning("id")
    .executeTakeFirstOrThrow();
}

/** Locks a set's row for the rest of the transaction; undefined when there is none. */
export function lockSet(trx: Transaction<Database>, id: number) {
  return trx.selectFrom("coefficient_sets").selectAll().where("id", "=", id).forUpdate().executeTakeFirst();
}

/** Counts a change to a set (its version) and when it happened; `latestRevision` also moves its latest revision. */
export async function touchSet(trx: Transaction<Database>, id: number, latestRevision?: number): Promise<void> {
  await trx
    .updateTable("coefficient_sets")
    .set({ ...(latestRevision === undefined ? {} : { latest_revision: latestRevision }), updated_at: sql`now()`, version: sql`version + 1` })
    .where("id", "=", id)
    .execute();
}

/** Retires a set (counted as a change). */
export async function markSetRetired(trx: Transaction<Database>, id: number): Promise<void> {
  await trx
    .updateTable("coefficient_sets")
    .set({ retired_at: sql`now()`, updated_at: sql`now()`, version: sql`version + 1` })
    .where("id", "=", id)
    .execute();
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
