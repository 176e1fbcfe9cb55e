import type { FaultKind } from "@/lib/protocol";
import type { Clock, Logger } from "../clock";
import { throttledWarn } from "../throttled-log";

export type FaultCounts = Partial<Record<FaultKind, number>>;

/**
 * Counts faults per channel (or topic path) and kind, and logs each kind at most once per
 * `logEveryMs` with the number suppressed since, so a flood of bad messages cannot flood the log.
 */
export interface FaultLog {
  record(where: string, kind: FaultKind, detail?: string): void;
  byChannel(): Record<string, FaultCounts>;
  totals(): FaultCounts;
}

export function createFaultLog(deps: { clock: Clock; logger: Logger; logEveryMs?: number }): FaultLog {
  const warn = throttledWarn({ clock: deps.clock, logger: deps.logger, everyMs: deps.logEveryMs });
  const counts = new Map<string, FaultCounts>();
  const totals: FaultCounts = {};
  /** Most distinct paths tracked; unknown topics beyond it are pooled under "(other)". */
  const maxPaths = 1024;

  return {
    record(where, kind, detail) {
      const key = counts.has(where) || counts.size < maxPaths ? where : "(other)";
      const entry = counts.get(key) ?? {};
      entry[kind] = (entry[kind] ?? 0) + 1;
      counts.set(key, entry);
      totals[kind] = (totals[kind] ?? 0) + 1;
      warn(kind, `ingest fault ${kind} on ${where}${detail ? `: ${detail}` : ""}`);
    },
    byChannel: () => Object.fromEntries([...counts].map(([k, v]) => [k, { ...v }])),
    totals: () => ({ ...totals }),
  };
}
