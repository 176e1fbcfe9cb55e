import { sql, type Transaction } from "kysely";
import type { RevisionContent } from "@/lib/coefficients";
import type { FilterDesign, FilterSpec } from "@/lib/dsp";
import type { RevisionState } from "@/lib/workflow";
import type { Db } from "../client";
import type { Database } from "../types";
import { readAnalysis, readDesign, readQuantized, readSpec } from "../json-columns";
import { channelPathSql } from "./channels";


const pathExpr = channelPathSql("rg", "d", "c");

function revisionQuery(db: Db) {
  return db
    .selectFrom("revisions as r")
    .innerJoin("coefficient_sets as s", "s.id", "r.set_id")
    .innerJoin("channels as c", "c.id", "s.channel_id")
    .innerJoin("devices as d", "d.id", "c.device_id")
    .innerJoin("rigs as rg", "rg.id", "d.rig_id")
    .innerJoin("users as u", "u.id", "r.author_id")
    .select([
      "r.id",
      "r.set_id as setId",
      "r.revision",
      "r.spec",
      "r.design",
      "r.quantized",
      "r.analysis",
      "r.device_format as format",
      "r.sample_rate_hz as sampleRateHz",
      "r.author_id as authorId",
      "u.display_name as author",
      "r.notes",
      "r.created_at as createdAt",
      "r.state",
      "r.state_version as stateVersion",
      "r.state_changed_at as stateChangedAt",
      "s.name as setName",
      "s.retired_at as retiredAt",
      pathExpr.as("channel"),
    ]);
}

/** A revision as pages and routes see it (JSON columns typed). */
export interface RevisionView {
  id: number;
  setId: number;
  revision: number;
  spec: FilterSpec;
  design: FilterDesign;
  quantized: RevisionContent["quantized"];
  analysis: RevisionContent["analysis"];
  format: "f32" | "q15" | "q31";
  sampleRateHz: number;
  authorId: number;
  author: string;
  notes: string;
  createdAt: Date;
  state: RevisionState;
  stateVersion: number;
  stateChangedAt: Date;
  setName: string;
  retiredAt: Date | null;
  channel: string;
}

type RevisionRow = Awaited<ReturnType<ReturnType<typeof revisionQuery>["executeTakeFirstOrThrow"]>>;

/** A revision row with its JSON columns opened (each checked, see db/json-columns.ts). */
function toView(row: RevisionRow): RevisionView {
  const at = { table: "revisions", id: row.id } as const;
  return {
    ...row,
    spec: readSpec(row.spec, at),
    design: readDesign(row.design, at),
    quantized: readQuantized(row.quantized, at),
    analysis: readAnalysis(row.analysis, at),
  };
}

export async function findRevision(db: Db, id: number): Promise<RevisionView | undefined> {
  const row = await revisionQuery(db).where("r.id", "=", id).executeTakeFirst();
  return row && toView(row);
}

export async function listRevisions(db: Db, setId: number): Promise<RevisionView[]> {
  return (await revisionQuery(db).where("r.set_id", "=", setId).orderBy("r.revision", "desc").execute()).map(toView);
}

/** Revisions waiting for a lead, oldest submission first. */
export async function listAwaitingReview(db: Db): Promise<RevisionView[]> {
  const rows = await revisionQuery(db).where("r.state", "=", "in_review").where("s.retired_at", "is", null).orderBy("r.state_changed_at").execute();
  return rows.map(toView);
}

export function listReviews(db: Db, setId: number) {
  return db
    .selectFrom("reviews as v")
    .innerJoin("revisions as r", "r.id", "v.revision_id")
    .innerJoin("users as u", "u.id", "v.reviewer_id")
    .select(["v.id", "r.revision", "v.revision_id as revisionId", "v.decision", "v.comment", "v.at", "u.display_name as reviewer"])
    .where("r.set_id", "=", setId)
    .orderBy("v.id", "desc")
    .execute();
}

/** Locks a revision's row for the rest of the transaction (`update` to change its state, `share` to promote it); undefined when there is none. */
export function lockRevision(trx: Transaction<Database>, id: number, mode: "update" | "share") {
  const q = trx.selectFrom("revisions").select(["id", "state_version as stateVersion"]).where("id", "=", id);
  return (mode === "update" ? q.forUpdate() : q.forShare()).executeTakeFirst();
}

/** Moves a revision to a review state and counts the change in its state version. */
export async function setRevisionState(trx: Transaction<Database>, id: number, to: RevisionState): Promise<void> {
  await trx.updateTable("revisions").set({ state: to, state_version: sql`state_version + 1`, state_changed_at: sql`now()` }).where("id", "=", id).execute();
}

/** Records a lead's decision on a revision. */
export async function insertReview(
  trx: Transaction<Database>,
  review: { revisionId: number; reviewerId: number; decision: "approved" | "rejected"; comment: string },
): Promise<void> {
  await trx.insertInto("reviews").values({ revision_id: review.revisionId, reviewer_id: review.reviewerId, decision: review.decision, comment: review.comment }).execute();
}
