import { MAX_RATE_MISMATCH, MAX_SAMPLES } from "./limits";
import { inferSampleRate } from "./rate";
import { isIsoTimestamp, parseIsoTimestamp, splitHeader } from "./time-column";
import { csvRecords, CsvSyntaxError, type CsvRecord } from "./tokenize";

/** Which upload field an error belongs beside. */
export type UploadField = "file" | "sampleRateHz";

/** A refused CSV: a message in plain words, the field it concerns and, when known, the line and column. */
export class RecordingCsvError extends Error {
  constructor(
    message: string,
    readonly field: UploadField = "file",
    readonly line: number | null = null,
    readonly column: string | null = null,
  ) {
    super(message);
    this.name = "RecordingCsvError";
  }
}

export interface CsvOptions {
  /** The channel's sample rate in Hz; the recording's must agree within MAX_RATE_MISMATCH. */
  channelRateHz: number;
  /** A rate given with the upload, in Hz; required when the file has no time column. */
  sampleRateHz?: number;
}

export type TimeKind = "t_s" | "iso" | "none";

export interface ParsedRecording {
  samples: Float64Array;
  sampleRateHz: number;
  /** "given" when the upload named the rate, else read from the time column. */
  rateSource: "given" | "inferred";
  /** First sample time for ISO time columns; null for relative seconds or no time column. */
  startedAt: Date | null;
  /** Samples that were empty or NaN. */
  missing: number;
  time: TimeKind;
  /** The value column's header, its name and unit (null when the header has no [unit]). */
  column: { header: string; name: string; unit: string | null };
}

/** RFC 4180 number with '.' as the decimal separator (no thousands separators, no Infinity). */
const NUMBER = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;

/** A cell as a finite double, or null: not a '.'-decimal number, or one past ±1.8e308 (like 1e999), which would read as ±Infinity. */
function finiteNumber(cell: string): number | null {
  if (!NUMBER.test(cell)) return null;
  const value = Number(cell);
  return Number.isFinite(value) ? value : null;
}

function timeKindOf(header: string[], first: CsvRecord | undefined): TimeKind {
  const name = header[0].trim();
  if (name === "t_s" || splitHeader(name).name === "t_s") return "t_s";
  if (first && isIsoTimestamp(first.fields[0] ?? "")) return "iso";
  return "none";
}

const rateText = (hz: number) => `${Number(hz.toPrecision(7))} Hz`;

/**
 * Parses a recorded trace (the CSV format in docs/recordings.md): one header row; an optional first time column, `t_s`
 * (relative seconds) or ISO 8601 timestamps with a zone; exactly one value column. Empty or NaN cells
 * become NaN and are counted; anything else that is not a '.'-decimal number is refused with its line
 * and column. The rate comes from the upload or from the median time step (steps must increase and
 * agree within 1 %), and must match the channel's rate within 0.1 %. Throws RecordingCsvError.
 */
export function parseRecordingCsv(text: string, opts: CsvOptions): ParsedRecording {
  const records = csvRecords(text);
  const head = wrap(() => records.next());
  if (head.done || head.value.fields.every((f) => f.trim() === "")) throw new RecordingCsvError("The file is empty: it needs a header row and at least two samples.");
  const header = head.value.fields;
  const firstRow = wrap(() => records.next());
  const first = firstRow.done ? undefined : firstRow.value;
  const time = timeKindOf(header, first);
  const valueHeaders = time === "none" ? header : header.slice(1);
  if (valueHeaders.length !== 1) {
    throw new RecordingCsvError(
      valueHeaders.length === 0
        ? "The file has a time column but no value column. Add one column of samples with its unit, like torque[N·m]."
        : `The file has ${valueHeaders.length} value columns (${valueHeaders.map((h) => h.trim()).join(", ")}); upload one channel per file. ` +
            "A time column must come first and be named t_s (seconds) or hold ISO 8601 timestamps with a zone.",
    );
  }
  if (time === "none" && opts.sampleRateHz === undefined) {
    throw new RecordingCsvError("The file has no time column, so give the sample rate. Or make the first column t_s (seconds) or ISO 8601 timestamps.", "sampleRateHz");
  }
  const valueHeader = valueHeaders[0].trim();
  const width = header.length;
  const values: number[] = [];
  const times: number[] = [];
  const lines: number[] = [];
  let missing = 0;
  let base: number | null = null;
  let startedAt: Date | null = null;

  const take = (rec: CsvRecord) => {
    if (rec.fields.length !== width) {
      throw new RecordingCsvError(`Line ${rec.line}: ${rec.fields.length} fields where the header has ${width}.`, "file", rec.line);
    }
    if (values.length >= MAX_SAMPLES) throw new RecordingCsvError(`The file holds more than ${MAX_SAMPLES.toLocaleString("en-US")} samples, the limit for one recording. Split it into shorter captures.`);
    if (time === "t_s") {
      const cell = rec.fields[0].trim();
      const t = finiteNumber(cell);
      if (t === null) throw new RecordingCsvError(`Line ${rec.line}, column ${header[0].trim()}: "${cell}" is not a time in seconds. Every row needs its time, written with '.' decimals.`, "file", rec.line, header[0].trim());
      times.push(t);
    } else if (time === "iso") {
      const ts = parseIsoTimestamp(rec.fields[0]);
      if (!ts) throw new RecordingCsvError(`Line ${rec.line}, column ${header[0].trim()}: "${rec.fields[0].trim()}" is not an ISO 8601 timestamp with a zone (like 2026-12-01T08:00:00.000Z).`, "file", rec.line, header[0].trim());
      if (base === null) {
        base = ts.epochMs;
        startedAt = new Date(ts.epochMs + Math.floor(ts.fractionS * 1000));
      }
      times.push((ts.epochMs - base) / 1000 + ts.fractionS);
    }
    const cell = rec.fields[width - 1].trim();
    const value = finiteNumber(cell);
    if (cell === "" || cell.toLowerCase() === "nan") {
      values.push(NaN);
      missing++;
    } else if (value !== null) {
      values.push(value);
    } else {
      throw new RecordingCsvError(
        `Line ${rec.line}, column ${valueHeader}: "${cell}" is not a finite number. Use '.' for decimals and leave missing samples empty (or NaN), never 0.`,
        "file",
        rec.line,
        valueHeader,
      );
    }
    lines.push(rec.line);
  };

  if (first) take(first);
  for (;;) {
    const next = wrap(() => records.next());
    if (next.done) break;
    take(next.value);
  }
  if (values.length < 2) throw new RecordingCsvError("The file needs at least two samples under its header.");

  const rate = rateOf(time, Float64Array.from(times), lines, opts);
  const mismatch = Math.abs(rate.sampleRateHz - opts.channelRateHz) / opts.channelRateHz;
  if (mismatch > MAX_RATE_MISMATCH) {
    throw new RecordingCsvError(
      `The recording's sample rate is ${rateText(rate.sampleRateHz)} (${rate.rateSource === "given" ? "as given" : "from the time column"}) but the channel samples at ${rateText(opts.channelRateHz)}; ` +
        `they must agree within ${MAX_RATE_MISMATCH * 100} % because filter coefficients only hold at the rate they were designed for.`,
      rate.rateSource === "given" ? "sampleRateHz" : "file",
    );
  }
  const { name, unit } = splitHeader(valueHeader);
  return { samples: Float64Array.from(values), ...rate, startedAt, missing, time, column: { header: valueHeader, name, unit } };
}

function rateOf(time: TimeKind, times: Float64Array, lines: number[], opts: CsvOptions): Pick<ParsedRecording, "sampleRateHz" | "rateSource"> {
  if (opts.sampleRateHz !== undefined && !(opts.sampleRateHz > 0 && Number.isFinite(opts.sampleRateHz))) {
    throw new RecordingCsvError(`The sample rate must be a number of Hz above 0 (got ${opts.sampleRateHz}).`, "sampleRateHz");
  }
  if (time === "none") return { sampleRateHz: opts.sampleRateHz as number, rateSource: "given" };
  const inferred = inferSampleRate(times, lines);
  if ("problem" in inferred) throw new RecordingCsvError(inferred.problem.message, "file", inferred.problem.line);
  if (opts.sampleRateHz === undefined) return { sampleRateHz: inferred.sampleRateHz, rateSource: "inferred" };
  if (Math.abs(inferred.sampleRateHz - opts.sampleRateHz) / opts.sampleRateHz > MAX_RATE_MISMATCH) {
    throw new RecordingCsvError(`The given rate ${rateText(opts.sampleRateHz)} disagrees with the time column (${rateText(inferred.sampleRateHz)}). Leave the rate empty to use the time column.`, "sampleRateHz");
  }
  return { sampleRateHz: opts.sampleRateHz, rateSource: "given" };
}

function wrap<T>(fn: () => T): T {
  try {
    return fn();
  } catch (err) {
    if (err instanceof CsvSyntaxError) throw new RecordingCsvError(err.message, "file", err.line);
    throw err;
  }
}
