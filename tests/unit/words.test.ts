import { describe, expect, it } from "vitest";
import { lostBatchesText } from "@/components/overview/format";
import { formatDateTime } from "@/lib/format/date-time";
import { countOf } from "@/lib/format/plural";
import { decide, STATE_LABELS, stateWord } from "@/lib/workflow";

describe("the one date-time format", () => {
  it("writes a moment as ISO 8601 date and time to the second in UTC, named", () => {
    const at = Date.UTC(2026, 11, 4, 3, 30, 12, 987);
    expect(formatDateTime(at)).toBe("2026-12-04 03:30:12 UTC");
    expect(formatDateTime(new Date(at))).toBe("2026-12-04 03:30:12 UTC");
    expect(formatDateTime("2026-12-04T05:30:12.987+02:00")).toBe("2026-12-04 03:30:12 UTC");
  });

  it("writes a dash for no moment or an unreadable one", () => {
    expect(formatDateTime(null)).toBe("—");
    expect(formatDateTime(undefined)).toBe("—");
    expect(formatDateTime("yesterday-ish")).toBe("—");
  });
});

describe("counts with their noun", () => {
  it("uses the singular for exactly one", () => {
    expect(countOf(1, "section")).toBe("1 section");
    expect(countOf(2, "section")).toBe("2 sections");
    expect(countOf(0, "tap")).toBe("0 taps");
    expect(countOf(1, "lost batch", "lost batches")).toBe("1 lost batch");
    expect(countOf(3, "lost batch", "lost batches")).toBe("3 lost batches");
  });

  it("gives lost batches their time base", () => {
    expect(lostBatchesText(1, Date.UTC(2026, 11, 4, 3, 0, 0))).toBe("1 lost batch since 2026-12-04 03:00:00 UTC");
  });
});

describe("states in words", () => {
  it("never shows an identifier with an underscore", () => {
    for (const [state, label] of Object.entries(STATE_LABELS)) {
      expect(label, state).not.toMatch(/_/);
      expect(stateWord(state as keyof typeof STATE_LABELS)).toBe(label.toLowerCase());
    }
    expect(stateWord("in_review")).toBe("in review");
    expect(stateWord("rolled_back")).toBe("rolled back");
  });

  it("refusals name states in words", () => {
    const refusal = decide("submit", { role: "engineer", actorId: 1, authorId: 1, state: "in_review", retired: false });
    expect(refusal).toMatchObject({ ok: false, reason: "Only a revision that is draft can be submitted; this one is in review." });
  });
});
