import { FAULT_KINDS, type FaultKind } from "@/lib/protocol";
import { formatDateTime } from "@/lib/format/date-time";
import { countOf } from "@/lib/format/plural";

/** After this long without samples a channel reads as stale, ms. */
export const STALE_AFTER_MS = 5_000;

/** "0.2 s ago" while fresh; "stale 12 s", "stale 4 min", "stale 2 h" after STALE_AFTER_MS; "no samples yet" for null. */
export function sampleAge(ageMs: number | null): { text: string; stale: boolean } {
  if (ageMs === null) return { text: "no samples yet", stale: true };
  const age = Math.max(0, ageMs);
  if (age <= STALE_AFTER_MS) return { text: `${(age / 1000).toFixed(1)} s ago`, stale: false };
  const s = Math.floor(age / 1000);
  if (s < 120) return { text: `stale ${s} s`, stale: true };
  if (s < 7200) return { text: `stale ${Math.floor(s / 60)} min`, stale: true };
  return { text: `stale ${Math.floor(s / 3600)} h`, stale: true };
}

/** Lost batches with their time base: "1 lost batch since 2026-12-04 03:30:12 UTC". */
export function lostBatchesText(count: number, sinceMs: number): string {
  return `${countOf(count, ...FAULT_WORDS.seq_gap)} since ${formatDateTime(sinceMs)}`;
}

/** What a lost batch is, in one line. */
export const LOST_BATCHES_MEANING =
  "batches the device sent that never arrived (gaps in its sequence numbers); their samples are missing from traces and recordings.";

/** Each ingest fault kind in words, as a count reads it ("3 lost batches", "1 message not JSON"). */
const FAULT_WORDS: Record<FaultKind, [string, string]> = {
  bad_topic: ["message on an unknown topic", "messages on unknown topics"],
  oversized: ["message too large", "messages too large"],
  bad_json: ["message not JSON", "messages not JSON"],
  bad_binary: ["unreadable binary message", "unreadable binary messages"],
  bad_shape: ["message of the wrong shape", "messages of the wrong shape"],
  non_finite: ["message with a non-finite sample", "messages with non-finite samples"],
  bad_length: ["message of the wrong length", "messages of the wrong length"],
  unknown_channel: ["message for an unknown channel", "messages for unknown channels"],
  rate_mismatch: ["message at the wrong sample rate", "messages at the wrong sample rate"],
  seq_gap: ["lost batch", "lost batches"],
  handler_error: ["message that failed to process", "messages that failed to process"],
  foreign_ack: ["acknowledgement from another device", "acknowledgements from other devices"],
};

/** Fault counts in words, largest first: "3 messages not JSON · 1 message too large"; empty when there are none. */
export function faultSummary(faults: Partial<Record<FaultKind, number>>): string {
  return FAULT_KINDS.flatMap((kind) => ((faults[kind] ?? 0) > 0 ? [[kind, faults[kind] ?? 0] as const] : []))
    .sort((a, b) => b[1] - a[1])
    .map(([kind, n]) => countOf(n, ...FAULT_WORDS[kind]))
    .join(" · ");
}

/**
 * The points of a min/max envelope as one closed SVG polygon: maxima left to right, then minima
 * right to left, scaled to width × height (y down). A flat envelope sits on the middle line.
 */
export function envelopePoints(min: readonly number[], max: readonly number[], width: number, height: number): string {
  const n = Math.min(min.length, max.length);
  if (n === 0) return "";
  let lo = Infinity;
  let hi = -Infinity;
  for (let i = 0; i < n; i++) {
    lo = Math.min(lo, min[i]);
    hi = Math.max(hi, max[i]);
  }
  const x = (i: number) => (n === 1 ? width / 2 : (i * width) / (n - 1));
  const y = (v: number) => (hi === lo ? height / 2 : height - ((v - lo) / (hi - lo)) * height);
  const pts: string[] = [];
  for (let i = 0; i < n; i++) pts.push(`${x(i).toFixed(1)},${y(max[i]).toFixed(1)}`);
  for (let i = n - 1; i >= 0; i--) pts.push(`${x(i).toFixed(1)},${y(min[i]).toFixed(1)}`);
  return pts.join(" ");
}
