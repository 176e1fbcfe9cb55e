import { roleAtLeast, type Role } from "@/lib/auth/roles";
import { stateWord, TRANSITIONS, type RevisionState, type Transition } from "./states";

/** Everything a person can do to a set or a revision. */
export const ACTIONS = ["create_set", "save_revision", "submit", "approve", "reject", "promote", "rollback", "retire"] as const;
export type WorkflowAction = (typeof ACTIONS)[number];

/** The least role for each action (admin ⊃ lead ⊃ engineer ⊃ operator). */
export const ACTION_ROLE: Record<WorkflowAction, Role> = {
  create_set: "engineer",
  save_revision: "engineer",
  submit: "engineer",
  approve: "lead",
  reject: "lead",
  promote: "lead",
  rollback: "lead",
  retire: "lead",
};

/** What the rules need to know about the actor and the target. */
export interface WorkflowSubject {
  role: Role;
  actorId: number;
  /** Author of the revision acted on (transitions and promotion). */
  authorId?: number;
  /** Current review state of the revision acted on. */
  state?: RevisionState;
  /** Whether the set is retired. */
  retired?: boolean;
  /** Whether the revision acted on may go to a device (false: its stored analysis says it may not). */
  deployable?: boolean;
}

/** forbidden = the person may not (403); conflict = not in this state (409). */
export type Decision = { ok: true } | { ok: false; code: "forbidden" | "conflict"; reason: string };

const deny = (code: "forbidden" | "conflict", reason: string): Decision => ({ ok: false, code, reason });

function isTransition(action: WorkflowAction): action is Transition {
  return action in TRANSITIONS;
}

/**
 * The one rule book for sets and revisions: role first (403), then four eyes (403: nobody approves
 * or rejects their own revision), then the state (409: a retired set takes no changes, a transition
 * only from its source state, approval only of a deployable revision, promotion only of an approved one).
 */
export function decide(action: WorkflowAction, s: WorkflowSubject): Decision {
  const need = ACTION_ROLE[action];
  if (!roleAtLeast(s.role, need)) return deny("forbidden", `This needs the ${need} role or higher.`);
  if ((action === "approve" || action === "reject") && s.authorId === s.actorId) {
    return deny("forbidden", "Four eyes: someone other than the author must review this revision.");
  }
  if (s.retired && action !== "rollback") return deny("conflict", "This set is retired; it takes no further changes.");
  if (isTransition(action)) {
    const { from } = TRANSITIONS[action];
    if (s.state !== from) return deny("conflict", `Only a revision that is ${stateWord(from)} can be ${pastTense(action)}; this one is ${isWhat(s.state)}.`);
  }
  if (action === "approve" && s.deployable === false) {
    return deny("conflict", "This revision is marked not deployable, so it cannot be approved; reject it or save a new revision.");
  }
  if (action === "promote" && s.state !== "approved") {
    return deny("conflict", `Only an approved revision can be promoted; this one is ${isWhat(s.state)}.`);
  }
  return { ok: true };
}

/** The state a subject is in, as a word in a sentence ("in review"), or what to say when it has none. */
const isWhat = (state: RevisionState | undefined): string => (state ? stateWord(state) : "not a revision");

function pastTense(action: Transition): string {
  return { submit: "submitted", approve: "approved", reject: "rejected" }[action];
}
