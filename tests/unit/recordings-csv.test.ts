import { describe, expect, it } from "vitest";
import { MAX_SAMPLES, parseRecordingCsv, RecordingCsvError } from "@/lib/recordings";

const KHZ = { channelRateHz: 1000 };

/** A t_s file at fs Hz with `n` samples of value(i), times written to 6 decimals. */
function tsCsv(n: number, fs: number, value: (i: number) => string = (i) => String(i * 0.5)): string {
  const rows = ["t_s,torque[N·m]"];
  for (let i = 0; i < n; i++) rows.push(`${(i / fs).toFixed(6)},${value(i)}`);
  return rows.join("\r\n") + "\r\n";
}

function refusal(text: string, opts: Parameters<typeof parseRecordingCsv>[1] = KHZ): RecordingCsvError {
  try {
    parseRecordingCsv(text, opts);
  } catch (err) {
    if (err instanceof RecordingCsvError) return err;
    throw err;
  }
  throw new Error("expected the file to be refused");
}

describe("parseRecordingCsv", () => {
  it("reads a t_s column, infers 1 kHz from the median step and keeps the unit", () => {
    const r = parseRecordingCsv(tsCsv(10, 1000), KHZ);
    expect(r.time).toBe("t_s");
    expect(r.rateSource).toBe("inferred");
    expect(r.sampleRateHz).toBe(1000);
    expect(r.startedAt).toBeNull();
    expect(r.column).toEqual({ header: "torque[N·m]", name: "torque", unit: "N·m" });
    expect([...r.samples]).toEqual([0, 0.5, 1, 1.5, 2, 2.5, 3, 3.5, 4, 4.5]);
  });

  it("reads ISO 8601 UTC timestamps with sub-millisecond fractions and records the start", () => {
    const rows = ["time,accel[m/s2]"];
    for (let i = 0; i < 6; i++) rows.push(`2026-12-01T08:00:00.${String(i * 2).padStart(4, "0")}Z,${i}`);
    const r = parseRecordingCsv(rows.join("\n"), { channelRateHz: 5000 });
    expect(r.time).toBe("iso");
    expect(r.sampleRateHz).toBe(5000);
    expect(r.startedAt?.toISOString()).toBe("2026-12-01T08:00:00.000Z");
    expect([...r.samples]).toEqual([0, 1, 2, 3, 4, 5]);
  });

  it("takes a given rate for a file without a time column", () => {
    const r = parseRecordingCsv("torque[N·m]\n1.5\n-2e-3\n3\n", { channelRateHz: 1000, sampleRateHz: 1000 });
    expect(r).toMatchObject({ time: "none", rateSource: "given", sampleRateHz: 1000 });
    expect([...r.samples]).toEqual([1.5, -0.002, 3]);
  });

  it("asks for the rate when there is no time column", () => {
    const err = refusal("torque[N·m]\n1\n2\n");
    expect(err.field).toBe("sampleRateHz");
    expect(err.message).toMatch(/no time column/);
  });

  it("checks a given rate against the time column", () => {
    expect(parseRecordingCsv(tsCsv(5, 1000), { channelRateHz: 1000, sampleRateHz: 1000 }).rateSource).toBe("given");
    const err = refusal(tsCsv(5, 1000), { channelRateHz: 1000, sampleRateHz: 500 });
    expect(err.field).toBe("sampleRateHz");
    expect(err.message).toMatch(/500 Hz disagrees with the time column \(1000 Hz\)/);
  });

  it("refuses a time step that jitters by more than 1 %, naming its line", () => {
    const rows = ["t_s,torque[N·m]", "0,1", "0.001,1", "0.002,1", "0.00302,1", "0.00402,1"];
    const err = refusal(rows.join("\n"));
    expect(err.line).toBe(5);
    expect(err.message).toMatch(/^Line 5: the time step is 1\.02 ms, 2 % off the median step 1 ms/);
    // 0.5 % is within the tolerance.
    expect(parseRecordingCsv(["t_s,x", "0,1", "0.001,1", "0.002,1", "0.003005,1", "0.004005,1"].join("\n"), KHZ).sampleRateHz).toBe(1000);
  });

  it("refuses a dropped row (a double step) and a time that does not increase", () => {
    expect(refusal(["t_s,x", "0,1", "0.001,1", "0.003,1", "0.004,1"].join("\n")).line).toBe(4);
    const back = refusal(["t_s,x", "0,1", "0.001,1", "0.001,1", "0.002,1"].join("\n"));
    expect(back.line).toBe(4);
    expect(back.message).toMatch(/does not increase/);
  });

  it("turns empty and NaN cells into NaN and counts them", () => {
    const r = parseRecordingCsv(tsCsv(6, 1000, (i) => ["1", "", "NaN", "nan", "2", '""'][i]), KHZ);
    expect(r.missing).toBe(4);
    expect([...r.samples].map((v) => (Number.isNaN(v) ? "NaN" : v))).toEqual([1, "NaN", "NaN", "NaN", 2, "NaN"]);
  });

  it("refuses a non-numeric cell with its line and column, including comma decimals", () => {
    const err = refusal(tsCsv(6, 1000, (i) => (i === 3 ? "oops" : "1")));
    expect(err).toMatchObject({ line: 5, column: "torque[N·m]" });
    expect(err.message).toBe(`Line 5, column torque[N·m]: "oops" is not a finite number. Use '.' for decimals and leave missing samples empty (or NaN), never 0.`);
    expect(refusal(tsCsv(4, 1000, (i) => (i === 1 ? '"1,5"' : "1"))).line).toBe(3);
    expect(refusal(tsCsv(4, 1000, (i) => (i === 1 ? "Infinity" : "1"))).line).toBe(3);
  });

  it("refuses numbers that overflow a double (1e999, -2e308) like Infinity, in the value and the time column", () => {
    for (const huge of ["1e999", "-2e308", "1" + "0".repeat(400)]) {
      const err = refusal(tsCsv(4, 1000, (i) => (i === 2 ? huge : "1")));
      expect(err).toMatchObject({ line: 4, column: "torque[N·m]" });
      expect(err.message).toContain(`"${huge}" is not a finite number`);
    }
    expect(refusal("t_s,x\n0,1\n1e999,2\n")).toMatchObject({ line: 3, column: "t_s" });
    expect(parseRecordingCsv(tsCsv(3, 1000, () => "1.7976931348623157e308"), KHZ).samples[0]).toBe(Number.MAX_VALUE);
    expect(refusal("t_s,x\n0,1\nabc,2\n")).toMatchObject({ line: 3, column: "t_s" });
  });

  it("refuses a channel-rate mismatch, saying both rates", () => {
    const err = refusal(tsCsv(10, 500), KHZ);
    expect(err.message).toMatch(/sample rate is 500 Hz \(from the time column\) but the channel samples at 1000 Hz/);
    // 0.05 % off passes; 0.2 % off does not.
    expect(parseRecordingCsv("x\n1\n2\n", { channelRateHz: 1000, sampleRateHz: 1000.5 }).sampleRateHz).toBe(1000.5);
    expect(refusal("x\n1\n2\n", { channelRateHz: 1000, sampleRateHz: 1002 }).field).toBe("sampleRateHz");
  });

  it("refuses several value columns, a ragged row, an open quote and an empty file", () => {
    expect(refusal("t_s,a[N],b[N]\n0,1,2\n0.001,1,2\n").message).toMatch(/2 value columns \(a\[N\], b\[N\]\)/);
    expect(refusal("time,a\n0,1\n1,2\n", { channelRateHz: 1, sampleRateHz: 1 }).message).toMatch(/2 value columns \(time, a\)/);
    expect(refusal("t_s,x\n0,1\n0.001\n").line).toBe(3);
    expect(refusal('t_s,x\n0,"1\n0.001,2\n').message).toMatch(/never closed/);
    expect(refusal("").message).toMatch(/empty/);
    expect(refusal("t_s,x\n0,1\n").message).toMatch(/at least two samples/);
  });

  it("reads quoted headers and fields with CRLF, a BOM and a blank line as a missing sample in one column", () => {
    const r = parseRecordingCsv('\ufeff"speed[rpm]"\r\n"1"\r\n\r\n3\r\n', { channelRateHz: 500, sampleRateHz: 500 });
    expect(r.column.unit).toBe("rpm");
    expect(r.missing).toBe(1);
    expect(r.samples.length).toBe(3);
  });

  it("refuses more than MAX_SAMPLES samples", () => {
    const body = "1\n".repeat(MAX_SAMPLES + 1);
    expect(refusal(`x\n${body}`, { channelRateHz: 1000, sampleRateHz: 1000 }).message).toMatch(/more than 2,000,000 samples/);
  });
});
