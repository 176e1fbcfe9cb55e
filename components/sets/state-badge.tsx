import { STATE_LABELS, type DeploymentState, type SetStatus } from "@/lib/workflow";

const TONE: Record<SetStatus | DeploymentState, string> = {
  draft: "bg-slate-100 text-slate-700 dark:bg-slate-800 dark:text-slate-200",
  in_review: "bg-sky-100 text-sky-800 dark:bg-sky-900/50 dark:text-sky-200",
  approved: "bg-brand-100 text-brand-700 dark:bg-brand-900/60 dark:text-brand-100",
  rejected: "bg-slate-200 text-slate-700 line-through dark:bg-slate-800 dark:text-slate-300",
  retired: "bg-slate-100 text-slate-500 dark:bg-slate-800 dark:text-slate-400",
  pending: "bg-sky-100 text-sky-800 dark:bg-sky-900/50 dark:text-sky-200",
  active: "bg-production/20 text-amber-800 ring-1 ring-production dark:text-amber-200",
  superseded: "bg-slate-100 text-slate-500 dark:bg-slate-800 dark:text-slate-400",
  failed: "bg-fault/10 text-fault",
  rolled_back: "bg-slate-100 text-slate-600 dark:bg-slate-800 dark:text-slate-300",
};

/** A small pill naming a review or deployment state; amber marks what runs in production, red a failure. */
export function StateBadge({ state }: { state: SetStatus | DeploymentState }) {
  return (
    <span data-state={state} className={`inline-block rounded-full px-2 py-0.5 text-xs font-medium ${TONE[state]}`}>
      {STATE_LABELS[state]}
    </span>
  );
}
