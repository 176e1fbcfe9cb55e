"use client";

import { Swatch } from "@/components/ui/swatch";
import { candidateColor, candidateName, type Candidate } from "@/lib/bench/candidates";
import { CautionBadge } from "./cautions-list";
import { MAX_CANDIDATES } from "@/lib/bench/colors";
import type { Caution } from "@/lib/bench/cautions";
import { hz, withUnit } from "@/lib/bench/format";
import { specSummary } from "@/lib/bench/spec-text";
import type { CandidateMetrics } from "@/lib/protocol";

export interface CardState {
  candidate: Candidate;
  designError: string | null;
  cautions: Caution[];
  metrics: CandidateMetrics | undefined;
}

/** The row of candidate cards, ending in an "Add candidate" card while fewer than six exist. */
export function CandidateCards({
  cards,
  unit,
  editingId,
  canEdit,
  onEdit,
  onToggle,
  onRemove,
  onAdd,
}: {
  cards: CardState[];
  /** The channel's unit, for the removed RMS. */
  unit: string;
  editingId: string | null;
  canEdit: boolean;
  onEdit: (id: string) => void;
  onToggle: (id: string, visible: boolean) => void;
  onRemove: (id: string) => void;
  onAdd: () => void;
}) {
  if (!canEdit && cards.length === 0) return null;
  return (
    <section aria-label="Candidates">
      <ul className="grid gap-3 sm:grid-cols-2 lg:grid-cols-3 2xl:grid-cols-4">
        {cards.map(({ candidate: c, designError, cautions, metrics }) => (
          <li
            key={c.id}
            data-testid={`candidate-${c.colorIndex}`}
            data-trace={c.id}
            className={`card flex flex-col gap-2 p-3 ${editingId === c.id ? "ring-2 ring-brand-500" : ""}`}
          >
            <div className="flex items-center gap-2">
              <Swatch color={candidateColor(c)} />
              <span className="text-sm font-medium">{candidateName(c)}</span>
              <label className="ml-auto flex items-center gap-1 text-xs text-slate-500">
                <input type="checkbox" checked={c.visible} onChange={(e) => onToggle(c.id, e.target.checked)} /> Shown
              </label>
            </div>
            <p className="text-sm" data-testid="candidate-summary">
              {specSummary(c.spec)}
            </p>
            {designError ? (
              <p role="alert" className="text-xs text-red-700 dark:text-red-300">
                {designError}
              </p>
            ) : (
              <dl className="num grid grid-cols-3 gap-1 text-xs">
                <div>
                  <dt className="text-slate-500">Removed RMS</dt>
                  <dd>{withUnit(metrics?.removedRms, unit)}</dd>
                </div>
                <div>
                  <dt className="text-slate-500">Lag</dt>
                  <dd>{withUnit(metrics?.lagMs, "ms")}</dd>
                </div>
                <div>
                  <dt className="text-slate-500" title="Measured: raw over filtered power in the Welch bin around the noise line">
                    Atten. at {typeof metrics?.noiseLineHz === "number" ? hz(metrics.noiseLineHz, 4) : "line"}
                  </dt>
                  <dd>{withUnit(metrics?.measuredAttenuationDb, "dB")}</dd>
                </div>
              </dl>
            )}
            <div className="mt-auto flex items-center gap-2">
              <CautionBadge cautions={cautions} />
              {canEdit && (
                <>
                  <button type="button" className="btn-quiet ml-auto px-2 py-1 text-xs" onClick={() => onEdit(c.id)} aria-label={`Edit ${candidateName(c)}`}>
                    Edit
                  </button>
                  <button type="button" className="btn-quiet px-2 py-1 text-xs" onClick={() => onRemove(c.id)} aria-label={`Remove ${candidateName(c)}`}>
                    Remove
                  </button>
                </>
              )}
            </div>
          </li>
        ))}
        {canEdit && cards.length < MAX_CANDIDATES && (
          <li>
            <button
              type="button"
              onClick={onAdd}
              className="flex h-full min-h-28 w-full flex-col items-center justify-center rounded-lg border-2 border-dashed border-slate-300 text-sm text-slate-600 hover:border-brand-500 hover:text-brand-700 dark:border-slate-700 dark:text-slate-300"
            >
              <span className="text-lg leading-none" aria-hidden="true">
                +
              </span>
              Add candidate
              <span className="text-xs text-slate-500">
                {cards.length} of {MAX_CANDIDATES} in use
              </span>
            </button>
          </li>
        )}
      </ul>
    </section>
  );
}
