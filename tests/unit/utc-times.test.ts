import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { clock } from "@/components/charts/chart-options";
import { fromUtcInput, toUtcInput } from "@/lib/alarms";

// 2026-12-03T10:15:30.250Z as epoch ms, written out by hand from the calendar (common practice).
const AT = Date.UTC(2026, 11, 3, 10, 15, 30, 250);

describe("times typed and shown in UTC, whatever the browser's zone", () => {
  // A zone five hours off UTC for these tests (Node reads TZ when it changes), restored after.
  const zone = process.env.TZ;
  beforeAll(() => {
    process.env.TZ = "America/New_York";
  });
  afterAll(() => {
    if (zone === undefined) delete process.env.TZ;
    else process.env.TZ = zone;
  });

  it("runs in a zone other than UTC", () => {
    expect(new Date(AT).getHours()).toBe(5);
  });

  it("an annotation's time input reads and writes UTC", () => {
    expect(toUtcInput(AT)).toBe("2026-12-03T10:15:30");
    expect(fromUtcInput("2026-12-03T10:15:30")).toBe(AT - 250);
    expect(fromUtcInput("2026-12-03T10:15")).toBe(AT - 30_250);
    expect(fromUtcInput(toUtcInput(AT))).toBe(AT - 250);
  });

  it("refuses what is not a date and time", () => {
    for (const bad of ["", "2026-12-03", "10:15:30", "2026-12-03 10:15:30", "2026-12-03T10:15:30Z", "2026-13-40T99:99:99"]) {
      expect(fromUtcInput(bad), bad).toBeNull();
    }
  });

  it("chart clock labels are UTC", () => {
    expect(clock(AT / 1000, false)).toBe("10:15:30");
    expect(clock(AT / 1000, true)).toBe("10:15:30.250");
  });
});
