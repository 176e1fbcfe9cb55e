import { describe, expect, it } from "vitest";
import { activationOutcome, checkRollback, passThroughEntry, promotionEntry } from "@/lib/workflow/deployment";
import { planTransition, type ReviewedRevision } from "@/lib/workflow/review";
import { buildRevisionContent } from "@/lib/coefficients";
import type { FilterSpec } from "@/lib/dsp";

const lead = { id: 2, role: "lead" as const };
const inReview: ReviewedRevision = { state: "in_review", stateVersion: 3, authorId: 1, retired: false, deployable: true };

describe("review transitions, decided before anything is written", () => {
  it("approves: the next state, a review to record and the audit entry's halves", () => {
    expect(planTransition(lead, inReview, { action: "approve", expectedVersion: 3, comment: "  fine  " })).toEqual({
      to: "approved",
      comment: "fine",
      review: "approved",
      audit: { before: { state: "in_review", stateVersion: 3 }, after: { state: "approved", stateVersion: 4, comment: "fine" } },
    });
  });

  it("submits without a review and without a comment in the audit", () => {
    const plan = planTransition({ id: 1, role: "engineer" }, { ...inReview, state: "draft" }, { action: "submit", expectedVersion: 3 });
    expect(plan).toMatchObject({ to: "in_review", review: null, audit: { after: { state: "in_review", stateVersion: 4 } } });
    expect(plan.audit.after).not.toHaveProperty("comment");
  });

  it("refuses a stale form first (409), then the rules (403 four eyes), then a rejection without a reason (400)", () => {
    expect(() => planTransition({ id: 1, role: "lead" }, inReview, { action: "approve", expectedVersion: 2 })).toThrow(/changed since you opened it/);
    expect(() => planTransition({ id: 1, role: "lead" }, inReview, { action: "approve", expectedVersion: 3 })).toThrow(/Four eyes/);
    expect(() => planTransition(lead, inReview, { action: "reject", expectedVersion: 3, comment: "   " })).toThrow(/Say why/);
    expect(() => planTransition(lead, { ...inReview, deployable: false }, { action: "approve", expectedVersion: 3 })).toThrow(/not deployable/);
  });
});

describe("deployment decisions", () => {
  const active = { id: 9, revisionId: 4, previousId: 5, passThrough: false };

  it("rolls back only from the active deployment the person saw, and not a channel that runs no filter", () => {
    expect(checkRollback(active, 9, "a/b/c")).toBe(active);
    expect(() => checkRollback(active, 8, "a/b/c")).toThrow(/changed since you looked/);
    expect(() => checkRollback(undefined, 9, "a/b/c")).toThrow(/changed since you looked/);
    expect(() => checkRollback({ ...active, passThrough: true }, 9, "a/b/c")).toThrow(/already runs no filter/);
  });

  it("supersedes the previous active deployment on a promotion and marks it rolled back on a rollback", () => {
    expect(activationOutcome("promote")).toEqual({ previousEnds: "superseded", auditAction: "deployment.activate", mail: "promoted" });
    expect(activationOutcome("rollback")).toEqual({ previousEnds: "rolled_back", auditAction: "deployment.rolled_back", mail: "rolled_back" });
  });

  it("builds the promoted entry for the channel's device, refuses another sample rate with 422, and empties it for no filter", () => {
    const spec: FilterSpec = { kind: "iir", family: "butterworth", response: "lowpass", order: 2, cutoffHz: 40, sampleRateHz: 500 };
    const content = buildRevisionContent(spec, "q15");
    const rev = { id: 7, design: content.design, format: "q15" as const, quantized: content.quantized };
    const channel = { path: "r/d/c", deviceKey: "d", key: "c", sampleRateHz: 500, coefficientFormat: "q15" as const, maxSections: 8, maxFirTaps: 64 };
    const entry = promotionEntry(rev, channel);
    expect(entry).toMatchObject({ revisionId: "7", format: "q15", sampleRateHz: 500, stages: [{ kind: "sections" }] });
    expect(() => promotionEntry(rev, { ...channel, sampleRateHz: 1000 })).toThrow(/^Refused for r\/d\/c: sample-rate mismatch/);
    expect(passThroughEntry(entry)).toEqual({ revisionId: "7", format: "q15", sampleRateHz: 500, stages: [] });
  });
});
