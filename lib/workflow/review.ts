import type { Role } from "@/lib/auth/roles";
import { AppError } from "@/lib/errors";
import { enforce } from "./enforce";
import { decide } from "./permissions";
import { TRANSITIONS, type RevisionState, type Transition } from "./states";

/** What a review transition needs to know about the revision, as read under its row lock. */
export interface ReviewedRevision {
  state: RevisionState;
  stateVersion: number;
  authorId: number;
  retired: boolean;
  deployable: boolean;
}

export interface TransitionRequest {
  action: Transition;
  /** The state version the form was rendered with; a different current version is a 409. */
  expectedVersion: number;
  comment?: string;
}

/** What a transition that passed every rule does: the new state, the review to record (approve, reject), the audit entry's halves. */
export interface TransitionPlan {
  to: RevisionState;
  comment: string;
  review: "approved" | "rejected" | null;
  audit: { before: { state: RevisionState; stateVersion: number }; after: Record<string, unknown> };
}

/**
 * Decides a review transition: a stale form first (409), then the rules (role, four eyes, state,
 * deployability), then a rejection's reason (400). Throws the refusal as an AppError.
 */
export function planTransition(actor: { id: number; role: Role }, rev: ReviewedRevision, input: TransitionRequest): TransitionPlan {
  if (rev.stateVersion !== input.expectedVersion) {
    throw new AppError("conflict", `This revision changed since you opened it (it is now ${rev.state}). Reload and try again.`);
  }
  enforce(decide(input.action, { role: actor.role, actorId: actor.id, authorId: rev.authorId, state: rev.state, retired: rev.retired, deployable: rev.deployable }));
  const comment = input.comment?.trim() ?? "";
  if (input.action === "reject" && !comment) throw new AppError("bad_request", "Say why the revision is rejected.");
  const to = TRANSITIONS[input.action].to;
  return {
    to,
    comment,
    review: input.action === "submit" ? null : input.action === "approve" ? "approved" : "rejected",
    audit: {
      before: { state: rev.state, stateVersion: rev.stateVersion },
      after: { state: to, stateVersion: rev.stateVersion + 1, ...(comment ? { comment } : {}) },
    },
  };
}
