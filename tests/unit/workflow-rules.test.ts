import { describe, expect, it } from "vitest";
import { ROLES, type Role } from "@/lib/auth/roles";
import { ACTIONS, decide, REVISION_STATES, type WorkflowAction } from "@/lib/workflow";

/** The expected role × action matrix, written out by hand (not derived from the rules under test). */
const ALLOWED: Record<Role, WorkflowAction[]> = {
  operator: [],
  engineer: ["create_set", "save_revision", "submit"],
  lead: ["create_set", "save_revision", "submit", "approve", "reject", "promote", "rollback", "retire"],
  admin: ["create_set", "save_revision", "submit", "approve", "reject", "promote", "rollback", "retire"],
};

/** The state in which each action is legitimate. */
const GOOD_STATE: Partial<Record<WorkflowAction, (typeof REVISION_STATES)[number]>> = {
  submit: "draft",
  approve: "in_review",
  reject: "in_review",
  promote: "approved",
};

const AUTHOR = 1;
const OTHER = 2;

describe("role × action matrix (someone else's revision, in the right state)", () => {
  for (const role of ROLES) {
    for (const action of ACTIONS) {
      const allowed = ALLOWED[role].includes(action);
      it(`${role} ${allowed ? "may" : "may not"} ${action}`, () => {
        const d = decide(action, { role, actorId: OTHER, authorId: AUTHOR, state: GOOD_STATE[action] });
        expect(d.ok).toBe(allowed);
        if (!d.ok) expect(d.code).toBe("forbidden");
      });
    }
  }
});

describe("state machine", () => {
  const transitions = [
    ["submit", "draft"],
    ["approve", "in_review"],
    ["reject", "in_review"],
    ["promote", "approved"],
  ] as const;
  for (const [action, from] of transitions) {
    for (const state of REVISION_STATES) {
      const ok = state === from;
      it(`${action} from ${state}: ${ok ? "allowed" : "409"}`, () => {
        const d = decide(action, { role: "admin", actorId: OTHER, authorId: AUTHOR, state });
        expect(d.ok ? "ok" : d.code).toBe(ok ? "ok" : "conflict");
      });
    }
  }

  it("takes no change on a retired set except a rollback of what is running", () => {
    for (const action of ["save_revision", "submit", "approve", "reject", "promote", "retire"] as const) {
      const d = decide(action, { role: "admin", actorId: OTHER, authorId: AUTHOR, state: GOOD_STATE[action], retired: true });
      expect(d).toMatchObject({ ok: false, code: "conflict" });
    }
    expect(decide("rollback", { role: "lead", actorId: OTHER, retired: true }).ok).toBe(true);
  });
});

describe("four eyes", () => {
  for (const role of ["lead", "admin"] as const) {
    for (const action of ["approve", "reject"] as const) {
      it(`a ${role} may not ${action} their own revision`, () => {
        const d = decide(action, { role, actorId: AUTHOR, authorId: AUTHOR, state: "in_review" });
        expect(d).toMatchObject({ ok: false, code: "forbidden", reason: expect.stringMatching(/Four eyes/) });
      });
    }
  }

  it("lets authors submit and promote their own approved revision (a reviewer already signed it off)", () => {
    expect(decide("submit", { role: "engineer", actorId: AUTHOR, authorId: AUTHOR, state: "draft" }).ok).toBe(true);
    expect(decide("promote", { role: "lead", actorId: AUTHOR, authorId: AUTHOR, state: "approved" }).ok).toBe(true);
  });

  it("checks the role before the state, so an operator learns nothing about the state", () => {
    expect(decide("approve", { role: "operator", actorId: OTHER, authorId: AUTHOR, state: "draft" })).toMatchObject({ code: "forbidden" });
  });
});

describe("a revision marked not deployable", () => {
  it("cannot be approved (409), but can still be rejected", () => {
    const subject = { role: "lead" as const, actorId: OTHER, authorId: AUTHOR, state: "in_review" as const, deployable: false };
    expect(decide("approve", subject)).toMatchObject({ ok: false, code: "conflict", reason: expect.stringMatching(/not deployable/) });
    expect(decide("reject", subject).ok).toBe(true);
    expect(decide("approve", { ...subject, deployable: true }).ok).toBe(true);
  });
});
