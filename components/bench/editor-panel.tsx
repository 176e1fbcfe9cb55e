"use client";

import { useState, type ReactNode } from "react";
import { Segmented } from "@/components/ui/segmented";
import { Swatch } from "@/components/ui/swatch";
import { candidateColor, candidateName, type Candidate } from "@/lib/bench/candidates";
import type { Caution } from "@/lib/bench/cautions";
import { defaultSpec } from "@/lib/bench/spec-defaults";
import { specSummary } from "@/lib/bench/spec-text";
import type { FilterSpec } from "@/lib/dsp";
import { CautionsList } from "./cautions-list";
import { KindSelect } from "./kind-select";
import { RequirementForm } from "./requirement-form";
import { SavePanel } from "./save-panel";
import { SpecForm } from "./spec-form";
import type { CandidateList } from "./use-candidates";

/**
 * The candidate editor in a side panel: the design kind, then its fields (or, for IIR, a requirement
 * with an estimated order); every valid edit re-plots at once and goes to the stream.
 */
export function EditorPanel({
  candidate,
  seedVersion,
  designError,
  cautions,
  onSpec,
  onClose,
  save,
}: {
  candidate: Candidate;
  /** Bumped when the spec is changed from outside the form (a seeded peak), so the form starts afresh. */
  seedVersion: number;
  designError: string | null;
  cautions: Caution[];
  onSpec: (spec: FilterSpec) => void;
  onClose: () => void;
  save: ReactNode;
}) {
  const fs = candidate.spec.sampleRateHz;
  const [mode, setMode] = useState<"order" | "requirement">("order");
  const kind = candidate.spec.kind;
  return (
    <aside
      aria-label="Candidate editor"
      className="fixed inset-y-0 right-0 z-30 flex w-full max-w-[28rem] flex-col border-l border-slate-200 bg-white shadow-xl dark:border-slate-800 dark:bg-slate-900"
    >
      <header className="flex items-center gap-2 border-b border-slate-200 px-4 py-3 dark:border-slate-800">
        <Swatch color={candidateColor(candidate)} />
        <h2 className="font-medium">Edit {candidateName(candidate)}</h2>
        <button type="button" className="btn-quiet ml-auto px-2 py-1" onClick={onClose} aria-label="Close the editor">
          Close
        </button>
      </header>
      <div className="flex-1 space-y-4 overflow-y-auto px-4 py-4">
        <KindSelect
          id="spec-kind"
          label="Kind of filter"
          value={kind}
          onChange={(k) => {
            setMode("order");
            onSpec(defaultSpec(k, fs));
          }}
        />
        {kind === "iir" && (
          <Segmented
            label="How to set the order"
            value={mode}
            onChange={setMode}
            options={[
              { value: "order", label: "Set the order" },
              { value: "requirement", label: "From a requirement" },
            ]}
          />
        )}
        {kind === "iir" && mode === "requirement" ? (
          <RequirementForm key={`${candidate.id}-req`} sampleRateHz={fs} onValid={onSpec} />
        ) : (
          <SpecForm key={`${candidate.id}-${kind}-${seedVersion}-${mode}`} initial={candidate.spec} onValid={onSpec} />
        )}
        {designError && (
          <p role="alert" className="rounded-md border border-fault/50 bg-red-50 px-3 py-2 text-sm text-red-900 dark:bg-red-950/40 dark:text-red-200">
            The design failed: {designError}
          </p>
        )}
        <CautionsList cautions={cautions} />
        {save}
      </div>
    </aside>
  );
}

/** The editor of the candidate being edited in `list`, saving to the given channel; nothing when none is. */
export function CandidateEditor({ list, channelPath, channelName }: { list: CandidateList; channelPath: string; channelName: string }) {
  const { editing, editingDesign } = list;
  if (!editing) return null;
  return (
    <EditorPanel
      candidate={editing}
      seedVersion={list.seedVersion}
      designError={editingDesign?.error ?? null}
      cautions={list.cautions.get(editing.id) ?? []}
      onSpec={(spec) => list.updateSpec(editing.id, spec)}
      onClose={() => list.setEditingId(null)}
      save={<SavePanel key={editing.id} channel={channelPath} spec={editingDesign?.design ? editing.spec : null} suggestedName={`${channelName} · ${specSummary(editing.spec)}`} />}
    />
  );
}
