import { describe, expect, it } from "vitest";
import { auditCsv } from "@/app/api/v1/audit/csv";
import { csvField, neutralised } from "@/lib/format/csv-field";

describe("audit CSV", () => {
  it("neutralises cells a spreadsheet would run as a formula (OWASP, CSV Injection)", () => {
    for (const formula of ["=1+2", "+1", "-1", "@SUM(A1)", "\tx", "\rx"]) expect(neutralised(formula)).toBe(`'${formula}`);
    for (const text of ["Lead", "2026-12-01T10:00:00.000Z", "42", '{"a":"=1"}', " =x"]) expect(neutralised(text)).toBe(text);
  });

  it("quotes after neutralising, per RFC 4180 §2", () => {
    expect(csvField('=HYPERLINK("http://x.test","a")')).toBe(`"'=HYPERLINK(""http://x.test"",""a"")"`);
    expect(csvField("\r=1")).toBe(`"'\r=1"`);
    expect(csvField("plain")).toBe("plain");
  });

  it("neutralises an actor whose name is a formula in the whole file", () => {
    const csv = auditCsv([
      {
        id: "1",
        at: new Date("2026-12-01T10:00:00.000Z"),
        actor: "=cmd|' /C calc'!A0",
        actorEmail: "x@tapwright.test",
        action: "set.create",
        entity: "set",
        entityId: "-5",
        before: null,
        after: { name: "@risk" },
      },
    ]);
    const row = csv.split("\r\n")[1];
    expect(row).toBe(`1,2026-12-01T10:00:00.000Z,'=cmd|' /C calc'!A0,x@tapwright.test,set.create,set,'-5,,"{""name"":""@risk""}"`);
  });
});
