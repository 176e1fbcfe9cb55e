import type { AlarmEventView } from "@/lib/protocol";

const SEVERITY = {
  critical: "bg-fault text-white",
  warning: "bg-fault/15 text-fault ring-1 ring-fault/40",
  advisory: "bg-slate-100 text-slate-700 ring-1 ring-slate-300 dark:bg-slate-800 dark:text-slate-200 dark:ring-slate-600",
} as const;

/** The alarm's severity as a pill: solid red for critical, red outline for warning, grey for advisory. */
export function SeverityBadge({ severity }: { severity: AlarmEventView["severity"] }) {
  return <span className={`inline-block rounded-full px-2 py-0.5 text-xs font-medium ${SEVERITY[severity]}`}>{severity}</span>;
}

/**
 * What state the alarm is in. A masked event (the raw signal crossed a limit the filtered signal
 * did not) has its own dashed look and words, so it never reads as an ordinary alarm.
 */
export function StateBadge({ event }: { event: Pick<AlarmEventView, "kind" | "state" | "acknowledgedAt"> }) {
  if (event.kind === "masked") {
    return (
      <span data-testid="masked-badge" className="inline-flex items-center gap-1 rounded border border-dashed border-fault px-1.5 py-0.5 text-xs font-medium text-fault">
        <FunnelIcon /> filter hid an excursion
      </span>
    );
  }
  const label = event.state === "raised" ? "raised" : event.acknowledgedAt ? "cleared" : "cleared, not acknowledged";
  const tone = event.state === "raised" ? "bg-fault text-white" : event.acknowledgedAt ? "text-slate-500" : "text-fault ring-1 ring-fault/50";
  return <span className={`inline-block rounded px-1.5 py-0.5 text-xs font-medium ${tone}`}>{label}</span>;
}

function FunnelIcon() {
  return (
    <svg aria-hidden viewBox="0 0 12 12" className="size-3 fill-none stroke-current" strokeWidth={1.4}>
      <path d="M1.5 2h9L7 6.5V10L5 9V6.5z" strokeLinejoin="round" />
    </svg>
  );
}
