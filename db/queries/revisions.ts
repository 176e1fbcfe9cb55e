import { sql, type Transaction } from "kysely";
import type { SessionUser } from "@/lib/auth/guard";
import type { RevisionContent } from "@/lib/coefficients";
import type { FilterDesign, FilterSpec } from "@/lib/dsp";
import { AppError } from "@/lib/errors";
import { reviewDecisionMail, reviewRequestedMail, type RevisionRef } from "@/lib/mail/templates";
import { decide, TRANSITIONS, type RevisionState, type Transition } from "@/lib/workflow";
import type { Db } from "../client";
import type { Database } from "../types";
import { readAnalysis, readDesign, readQuantized, readSpec } from "../json-columns";
import { appendAudit } from "./audit";
import { channelPathSql } from "./channels";
import { enqueueMail, leadAddresses, userAddress } from "./mail";
import { enforce } from "./sets";


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

export interface TransitionInput {
  revisionId: number;
  action: Transition;
  /** The state version the form was rendered with; a different current version is a 409. */
  expectedVersion: number;
  comment?: string;
}

/**
 * Moves a revision through review (submit, approve, reject) under a row lock: stale form → 409,
 * then the workflow rules (role, four eyes, state). Records the review, the audit entry and the
 * mail (review requested → leads; decision → author) in the caller's transaction.
 */
export async function transitionRevision(trx: Transaction<Database>, actor: SessionUser, input: TransitionInput): Promise<RevisionView> {
  const locked = await trx.selectFrom("revisions").select(["id", "state_version"]).where("id", "=", input.revisionId).forUpdate().executeTakeFirst();
  if (!locked) throw new AppError("not_found", "No such revision.");
  const rev = await findRevision(trx, input.revisionId);
  if (!rev) throw new AppError("not_found", "No such revision.");
  if (rev.stateVersion !== input.expectedVersion) {
    throw new AppError("conflict", `This revision changed since you opened it (it is now ${rev.state}). Reload and try again.`);
  }
  enforce(
    decide(input.action, { role: actor.role, actorId: actor.id, authorId: rev.authorId, state: rev.state, retired: rev.retiredAt !== null, deployable: rev.analysis.deployable.ok }),
  );
  const comment = input.comment?.trim() ?? "";
  if (input.action === "reject" && !comment) throw new AppError("bad_request", "Say why the revision is rejected.");
  const to = TRANSITIONS[input.action].to;
  await trx
    .updateTable("revisions")
    .set({ state: to, state_version: sql`state_version + 1`, state_changed_at: sql`now()` })
    .where("id", "=", rev.id)
    .execute();
  await trx.updateTable("coefficient_sets").set({ updated_at: sql`now()`, version: sql`version + 1` }).where("id", "=", rev.setId).execute();
  const ref: RevisionRef = { setId: rev.setId, setName: rev.setName, revision: rev.revision, channel: rev.channel };
  if (input.action === "submit") {
    await enqueueMail(trx, await leadAddresses(trx), reviewRequestedMail(ref, actor.name, rev.notes));
  } else {
    const decision = input.action === "approve" ? "approved" : "rejected";
    await trx.insertInto("reviews").values({ revision_id: rev.id, reviewer_id: actor.id, decision, comment }).execute();
    await enqueueMail(trx, await userAddress(trx, rev.authorId), reviewDecisionMail(ref, decision, actor.name, comment || "(no comment)"));
  }
  await appendAudit(trx, {
    actorId: actor.id,
    action: `revision.${input.action}`,
    entity: "revision",
    entityId: rev.id,
    before: { state: rev.state, stateVersion: rev.stateVersion },
    after: { state: to, stateVersion: rev.stateVersion + 1, ...(comment ? { comment } : {}) },
  });
  return { ...rev, state: to, stateVersion: rev.stateVersion + 1 };
}
