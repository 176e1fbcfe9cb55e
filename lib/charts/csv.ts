import { csvField } from "@/lib/format/csv-field";
import type { Column } from "./cursors";

/** A column's name and unit, as the chart labels it. */
export interface CsvColumn {
  label: string;
  unit: string;
}

/** "label (unit)", or the label alone when it already ends with its unit in brackets or there is none. */
export function headerCell(c: CsvColumn): string {
  const text = !c.unit || c.label.endsWith(`(${c.unit})`) ? c.label : `${c.label} (${c.unit})`;
  return csvField(text);
}

/**
 * A number as written to the file: the shortest text that reads back to the same double (ECMAScript
 * Number::toString, so full precision), "inf" or "-inf" for infinities, and an empty cell for a gap.
 */
export function numberCell(v: number | null | undefined): string {
  if (v === null || v === undefined || Number.isNaN(v)) return "";
  if (!Number.isFinite(v)) return v > 0 ? "inf" : "-inf";
  return String(v);
}

/**
 * A chart's data as RFC 4180 CSV with CRLF line ends: a header line (x, then each series with its unit; names
 * neutralised against spreadsheet formulas), then one row per x value.
 */
export function chartCsv(x: CsvColumn, series: readonly CsvColumn[], data: readonly Column[]): string {
  if (data.length !== series.length + 1) throw new Error(`chartCsv needs ${series.length + 1} columns (x and each series), got ${data.length}`);
  const header = [x, ...series].map(headerCell).join(",");
  const rows = Array.from({ length: data[0].length }, (_, i) => data.map((col) => numberCell(col[i])).join(","));
  return [header, ...rows].join("\r\n") + "\r\n";
}
