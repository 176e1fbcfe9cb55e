import { stageSummary } from "@/lib/bench/spec-text";
import { specStages, type FilterSpec } from "@/lib/dsp";

/** A revision's filter as its stages in running order, one summary line each; bypassed stages marked. */
export function RevisionStages({ spec }: { spec: FilterSpec }) {
  const stages = specStages(spec);
  return (
    <div className="text-sm">
      <p className="text-xs text-slate-500">{stages.length === 1 ? "Filter" : `Chain of ${stages.length} stages, run in this order`}</p>
      <ol className={stages.length > 1 ? "list-decimal pl-5" : ""} data-testid="revision-stages">
        {stages.map((s, i) => (
          <li key={i} data-bypassed={s.bypassed === true} className={s.bypassed ? "text-slate-400" : ""}>
            <span className={s.bypassed ? "line-through" : ""}>{stageSummary(s)}</span>
            {s.bypassed && <span className="ml-1.5 rounded bg-slate-200 px-1 text-xs text-slate-600 no-underline dark:bg-slate-700 dark:text-slate-300">bypassed, not run</span>}
          </li>
        ))}
      </ol>
    </div>
  );
}
