import { candidateName, type Candidate } from "@/lib/bench/candidates";
import { highestLevel, REVIEW_LINE, type Caution, type CautionLevel } from "@/lib/bench/cautions";
import { countOf } from "@/lib/format/plural";

/** The look of each caution level: red for a filter that does not settle, amber for a risk, quiet for advice. */
const LEVEL_CLASS: Record<CautionLevel, string> = {
  danger: "border-red-300 bg-red-50 text-red-950 dark:border-red-700/60 dark:bg-red-950/30 dark:text-red-100",
  warning: "border-amber-300 bg-amber-50 text-amber-950 dark:border-amber-700/60 dark:bg-amber-950/30 dark:text-amber-100",
  note: "border-slate-200 bg-transparent text-slate-700 dark:border-slate-700 dark:text-slate-300",
};

/** The badge of a count of cautions, coloured for the loudest among them (red, amber or quiet). */
const BADGE_CLASS: Record<CautionLevel, string> = {
  danger: "bg-red-100 text-red-900 dark:bg-red-900/40 dark:text-red-200",
  warning: "bg-amber-100 text-amber-900 dark:bg-amber-900/40 dark:text-amber-200",
  note: "bg-slate-100 text-slate-700 dark:bg-slate-800 dark:text-slate-300",
};

/** "2 cautions" on a candidate's card, in the colour of the loudest; nothing when there are none. */
export function CautionBadge({ cautions }: { cautions: Caution[] }) {
  const level = highestLevel(cautions);
  if (!level) return null;
  return (
    <span data-testid="caution-badge" data-level={level} className={`rounded px-1.5 py-0.5 text-xs ${BADGE_CLASS[level]}`}>
      {countOf(cautions.length, "caution")}
    </span>
  );
}

/** Cautions in plain words, each closing with the line that defers to review and local codes. */
export function CautionsList({ cautions, name }: { cautions: Caution[]; name?: string }) {
  if (cautions.length === 0) return null;
  return (
    <ul className="space-y-2" aria-label={name ? `Cautions for ${name}` : "Cautions"}>
      {cautions.map((c) => (
        <li key={c.kind} data-caution={c.kind} data-level={c.level} className={`rounded-md border px-3 py-2 text-sm ${LEVEL_CLASS[c.level]}`}>
          <p className="font-medium">
            {name ? `${name}: ` : ""}
            {c.title}
          </p>
          <p className="mt-0.5">{c.text}</p>
          <p className="mt-1 text-xs opacity-80">{REVIEW_LINE}</p>
        </li>
      ))}
    </ul>
  );
}

/** Every candidate's cautions, each list named for its candidate; nothing when none has any. */
export function CandidateCautions({ candidates, cautions }: { candidates: Candidate[]; cautions: Map<string, Caution[]> }) {
  if (!candidates.some((c) => (cautions.get(c.id)?.length ?? 0) > 0)) return null;
  return (
    <section aria-label="Cautions" className="space-y-2">
      {candidates.map((c) => (
        <CautionsList key={c.id} cautions={cautions.get(c.id) ?? []} name={candidateName(c)} />
      ))}
    </section>
  );
}
