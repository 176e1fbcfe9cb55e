import { trim } from "@/lib/format/units";
import type { AlarmEventView } from "@/lib/protocol";

/** "above 240 bar (high)" / "below 5 °C (low)". */
export function limitText(e: Pick<AlarmEventView, "side" | "limit" | "unit">): string {
  return `${e.side === "high" ? "above" : "below"} ${trim(e.limit, 6)} ${e.unit}`;
}

/** A duration in ms as "3 ms", "4.2 s", "3 min 5 s" or "2 h 4 min". */
export function durationText(ms: number): string {
  if (ms < 1000) return `${Math.round(ms)} ms`;
  if (ms < 60_000) return `${trim(ms / 1000, 2)} s`;
  const s = Math.round(ms / 1000);
  if (s < 3600) return `${Math.floor(s / 60)} min ${s % 60} s`;
  return `${Math.floor(s / 3600)} h ${Math.floor((s % 3600) / 60)} min`;
}

/** One line on what happened, in the operator's words. */
export function eventSummary(e: AlarmEventView): string {
  const peak = `${trim(e.peak, 5)} ${e.unit}`;
  if (e.kind === "masked") return `Raw went ${limitText(e)} (peak ${peak}); the filtered signal stayed inside: the filter hid it.`;
  const trace = e.signal === "raw" ? "Raw signal" : e.revisionId === null ? "Signal (no production filter, so raw)" : "Filtered signal";
  return `${trace} ${e.state === "raised" ? "is" : "went"} ${limitText(e)}, peak ${peak}.`;
}
