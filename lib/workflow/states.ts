/** Review states of a revision; approved revisions may be promoted, rejected ones are final. */
export const REVISION_STATES = ["draft", "in_review", "approved", "rejected"] as const;
export type RevisionState = (typeof REVISION_STATES)[number];

/** What a deployment goes through on one channel (pending → active → superseded, or failed, or rolled back). */
export const DEPLOYMENT_STATES = ["pending", "active", "superseded", "failed", "rolled_back"] as const;
export type DeploymentState = (typeof DEPLOYMENT_STATES)[number];

/** Why a deployment was made: a promotion of a revision, or a rollback to the one before. */
export type DeploymentKind = "promote" | "rollback";

/** A set's status in lists: retired, or the review state of its latest revision. */
export const SET_STATUSES = [...REVISION_STATES, "retired"] as const;
export type SetStatus = (typeof SET_STATUSES)[number];

/** The review transitions and the state each one leads to. */
export const TRANSITIONS = {
  submit: { from: "draft", to: "in_review" },
  approve: { from: "in_review", to: "approved" },
  reject: { from: "in_review", to: "rejected" },
} as const satisfies Record<string, { from: RevisionState; to: RevisionState }>;
export type Transition = keyof typeof TRANSITIONS;
export const TRANSITION_NAMES = Object.keys(TRANSITIONS) as Transition[];

export const STATE_LABELS: Record<SetStatus | DeploymentState, string> = {
  draft: "Draft",
  in_review: "In review",
  approved: "Approved",
  rejected: "Rejected",
  retired: "Retired",
  pending: "Pending",
  active: "Active",
  superseded: "Superseded",
  failed: "Failed",
  rolled_back: "Rolled back",
};

/** A state as a word inside a sentence: "in review", "rolled back" (STATE_LABELS in lower case). */
export function stateWord(state: SetStatus | DeploymentState): string {
  return STATE_LABELS[state].toLowerCase();
}
