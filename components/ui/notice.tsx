import type { ReactNode } from "react";

const TONE = {
  info: "border-slate-200 bg-slate-50 text-slate-700 dark:border-slate-800 dark:bg-slate-900 dark:text-slate-300",
  warn: "border-amber-300 bg-amber-50 text-amber-900 dark:border-amber-700/60 dark:bg-amber-950/40 dark:text-amber-200",
  error: "border-fault/50 bg-red-50 text-red-900 dark:bg-red-950/40 dark:text-red-200",
} as const;

/** A short message for empty, loading and error states: what is happening and what to do. */
export function Notice({ tone = "info", title, children }: { tone?: keyof typeof TONE; title: string; children?: ReactNode }) {
  return (
    <div role={tone === "error" ? "alert" : "status"} className={`rounded-md border px-3 py-2 text-sm ${TONE[tone]}`}>
      <p className="font-medium">{title}</p>
      {children && <div className="mt-0.5 text-[13px] opacity-90">{children}</div>}
    </div>
  );
}
