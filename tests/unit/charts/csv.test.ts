import { describe, expect, it } from "vitest";
import { chartCsv, headerCell, numberCell } from "@/lib/charts/csv";
import { chartFileName } from "@/lib/charts/file-name";

describe("chart CSV", () => {
  it("writes a header with units and one row per x value, CRLF per RFC 4180", () => {
    const csv = chartCsv({ label: "Frequency (Hz)", unit: "Hz" }, [{ label: "Raw", unit: "dB" }, { label: "Candidate A", unit: "dB" }], [[1, 2], [-3, -4.5], [null, 7]]);
    expect(csv).toBe("Frequency (Hz),Raw (dB),Candidate A (dB)\r\n1,-3,\r\n2,-4.5,7\r\n");
  });

  it("neutralises header names a spreadsheet would run as formulas, and quotes per RFC 4180 §2", () => {
    expect(headerCell({ label: "=HYPERLINK(\"http://x.test\")", unit: "dB" })).toBe(`"'=HYPERLINK(""http://x.test"") (dB)"`);
    expect(headerCell({ label: "@sum", unit: "" })).toBe("'@sum");
    expect(headerCell({ label: "-x", unit: "V" })).toBe("'-x (V)");
    expect(headerCell({ label: "Time", unit: "s since 1970-01-01 UTC" })).toBe("Time (s since 1970-01-01 UTC)");
  });

  it("writes numbers with full precision (each cell reads back to the same double)", () => {
    for (const v of [0.1 + 0.2, 1 / 3, -1e-300, 123456789.12345679, Math.PI * 1e21, 5e-324]) expect(Number(numberCell(v))).toBe(v);
    expect(numberCell(null)).toBe("");
    expect(numberCell(NaN)).toBe("");
    expect(numberCell(-Infinity)).toBe("-inf");
    expect(numberCell(Infinity)).toBe("inf");
  });

  it("refuses data whose columns do not match the series", () => {
    expect(() => chartCsv({ label: "x", unit: "" }, [{ label: "a", unit: "" }], [[1]])).toThrow(/needs 2 columns/);
  });
});

describe("chart file names", () => {
  const at = new Date(Date.UTC(2026, 11, 4, 3, 5, 9));

  it("are made from the title and the UTC time", () => {
    expect(chartFileName("Magnitude: Bode plot", "png", at)).toBe("magnitude-bode-plot-20261204-030509.png");
    expect(chartFileName("Frame strain (µε) — Ångström", "csv", at)).toBe("frame-strain-angstrom-20261204-030509.csv");
    expect(chartFileName("::", "csv", at)).toBe("chart-20261204-030509.csv");
  });

  it("cut a long title at a word", () => {
    const name = chartFileName("Live traces of the gearbox endurance rig torque node input torque channel over ten seconds", "png", at);
    expect(name).toBe("live-traces-of-the-gearbox-endurance-rig-torque-node-input-20261204-030509.png");
  });
});
