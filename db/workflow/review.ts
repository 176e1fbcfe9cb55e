import type { Transaction } from "kysely";
import type { SessionUser } from "@/lib/auth/guard";
import { AppError } from "@/lib/errors";
import { reviewDecisionMail, reviewRequestedMail, type RevisionRef } from "@/lib/mail/templates";
import { planTransition, type TransitionRequest } from "@/lib/workflow/review";
import type { Database } from "../types";
import { appendAudit } from "../queries/audit";
import { enqueueMail, leadAddresses, userAddress } from "../queries/mail";
import { findRevision, insertReview, lockRevision, setRevisionState, type RevisionView } from "../queries/revisions";
import { touchSet } from "../queries/sets";

export interface TransitionInput extends TransitionRequest {
  revisionId: number;
}

/**
 * Moves a revision through review (submit, approve, reject) under a row lock, as lib/workflow/review
 * decides; records the review, the audit entry and the mail (review requested → leads; decision →
 * author) in the caller's transaction.
 */
export async function transitionRevision(trx: Transaction<Database>, actor: SessionUser, input: TransitionInput): Promise<RevisionView> {
  const locked = await lockRevision(trx, input.revisionId, "update");
  const rev = locked && (await findRevision(trx, input.revisionId));
  if (!rev) throw new AppError("not_found", "No such revision.");
  const plan = planTransition(actor, { ...rev, retired: rev.retiredAt !== null, deployable: rev.analysis.deployable.ok }, input);
  await setRevisionState(trx, rev.id, plan.to);
  await touchSet(trx, rev.setId);
  const ref: RevisionRef = { setId: rev.setId, setName: rev.setName, revision: rev.revision, channel: rev.channel };
  if (plan.review === null) {
    await enqueueMail(trx, await leadAddresses(trx), reviewRequestedMail(ref, actor.name, rev.notes));
  } else {
    await insertReview(trx, { revisionId: rev.id, reviewerId: actor.id, decision: plan.review, comment: plan.comment });
    await enqueueMail(trx, await userAddress(trx, rev.authorId), reviewDecisionMail(ref, plan.review, actor.name, plan.comment || "(no comment)"));
  }
  await appendAudit(trx, { actorId: actor.id, action: `revision.${input.action}`, entity: "revision", entityId: rev.id, ...plan.audit });
  return { ...rev, state: plan.to, stateVersion: rev.stateVersion + 1 };
}
