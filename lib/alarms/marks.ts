import type { AlarmEventView } from "@/lib/protocol";

/** An annotation as a chart needs it. */
export interface NoteSpan {
  at: string;
  endAt: string | null;
  text: string;
}

export interface TraceMark {
  x: number;
  label: string;
  endX?: number;
  tone?: "alarm";
}

/** Longest label drawn over a trace, characters. */
const LABEL = 28;
const short = (text: string) => (text.length > LABEL ? `${text.slice(0, LABEL - 1)}…` : text);

/**
 * Annotations and alarms as chart marks, x in s after `originMs` (0 for epoch seconds, as the live
 * traces use; a recording's start for its replay): an annotation's moment or span with its text,
 * an alarm from its raise to its clear (open ones to `nowMs`), a masked one labelled as hidden.
 */
export function traceMarks(notes: readonly NoteSpan[], alarms: readonly AlarmEventView[], originMs: number, nowMs: number): TraceMark[] {
  const x = (iso: string) => (Date.parse(iso) - originMs) / 1000;
  const marks: TraceMark[] = notes.map((n) => ({ x: x(n.at), label: short(n.text), ...(n.endAt ? { endX: x(n.endAt) } : {}) }));
  for (const a of alarms) {
    const label = short(a.kind === "masked" ? `hidden: ${a.ruleName}` : `⚠ ${a.ruleName}`);
    marks.push({ x: x(a.raisedAt), label, endX: a.clearedAt ? x(a.clearedAt) : (nowMs - originMs) / 1000, tone: "alarm" });
  }
  return marks.sort((a, b) => a.x - b.x);
}
