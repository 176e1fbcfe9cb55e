"use client";

import { useEffect, useRef, useState, type ReactNode } from "react";
import { Swatch } from "@/components/ui/swatch";
import { candidateColor, candidateName, type Candidate } from "@/lib/bench/candidates";
import type { Caution } from "@/lib/bench/cautions";
import { specSummary } from "@/lib/bench/spec-text";
import type { FilterSpec } from "@/lib/dsp";
import { CautionsList } from "./cautions-list";
import { SavePanel } from "./save-panel";
import { StageList } from "./stage-list";
import type { CandidateList } from "./use-candidates";

/** Longest set name the save form suggests (the API takes 120 characters). */
const NAME_LENGTH = 120;

/**
 * The candidate editor in a side panel: the candidate's chain of stages, each with its design form;
 * every valid edit re-plots at once and goes to the stream.
 */
export function EditorPanel({
  candidate,
  seedVersion,
  seedNote,
  designError,
  cautions,
  onSpec,
  onValidity,
  onClose,
  save,
}: {
  candidate: Candidate;
  /** Bumped when the spec is changed from outside the form (a spectrum click), so the open form starts afresh. */
  seedVersion: number;
  /** What the last spectrum click could not do, in plain words. */
  seedNote: string | null;
  designError: string | null;
  cautions: Caution[];
  onSpec: (spec: FilterSpec) => void;
  onValidity: (valid: boolean) => void;
  onClose: () => void;
  save: ReactNode;
}) {
  const headingRef = useRef<HTMLHeadingElement>(null);
  const onCloseRef = useRef(onClose);
  useEffect(() => {
    onCloseRef.current = onClose;
  });
  // Opening moves focus to the heading; Escape closes (unless something inside already used it, such as a chart
  // clearing its cursors); closing gives focus back to the control that opened the editor, if it is still there.
  useEffect(() => {
    const opener = document.activeElement instanceof HTMLElement ? document.activeElement : null;
    headingRef.current?.focus();
    const onKey = (e: KeyboardEvent) => {
      if (e.key === "Escape" && !e.defaultPrevented) onCloseRef.current();
    };
    document.addEventListener("keydown", onKey);
    return () => {
      document.removeEventListener("keydown", onKey);
      if (opener?.isConnected) opener.focus();
    };
  }, []);
  return (
    <aside
      aria-label="Candidate editor"
      className="fixed inset-y-0 right-0 z-30 flex w-full max-w-[28rem] flex-col border-l border-slate-200 bg-white shadow-xl dark:border-slate-800 dark:bg-slate-900"
    >
      <header className="flex items-center gap-2 border-b border-slate-200 px-4 py-3 dark:border-slate-800">
        <Swatch color={candidateColor(candidate)} />
        <h2 ref={headingRef} tabIndex={-1} className="font-medium focus:outline-none">
          Edit {candidateName(candidate)}
        </h2>
        <button type="button" className="btn-quiet ml-auto px-2 py-1" onClick={onClose} aria-label="Close the editor" aria-keyshortcuts="Escape">
          Close
        </button>
      </header>
      <div className="flex-1 space-y-4 overflow-y-auto px-4 py-4">
        {seedNote && (
          <p role="status" className="rounded-md bg-slate-100 px-3 py-2 text-sm dark:bg-slate-800">
            From the spectrum: {seedNote}
          </p>
        )}
        <StageList key={`stages-${candidate.id}`} spec={candidate.spec} onSpec={onSpec} designError={designError} resetKey={seedVersion} onValidity={onValidity} />
        <CautionsList cautions={cautions} />
        {save}
      </div>
    </aside>
  );
}

/** A set name from the channel and the candidate's summary, cut to the length the API takes. */
function suggestedName(channelName: string, spec: FilterSpec): string {
  const name = `${channelName} · ${specSummary(spec)}`;
  return name.length <= NAME_LENGTH ? name : `${name.slice(0, NAME_LENGTH - 1)}…`;
}

/** The editor of the candidate being edited in `list`, saving to the given channel; nothing when none is. */
export function CandidateEditor({ list, channelPath, channelName }: { list: CandidateList; channelPath: string; channelName: string }) {
  const { editing, editingDesign } = list;
  const [formValid, setFormValid] = useState(true);
  if (!editing) return null;
  // Save takes exactly what the plots show: the candidate's spec, and only while no form holds an unusable value.
  const savable = formValid && editingDesign?.design ? editing.spec : null;
  return (
    <EditorPanel
      candidate={editing}
      seedVersion={list.seedVersion}
      seedNote={list.seedNote}
      designError={editingDesign?.error ?? null}
      cautions={list.cautions.get(editing.id) ?? []}
      onSpec={(spec) => list.updateSpec(editing.id, spec)}
      onValidity={setFormValid}
      onClose={() => list.setEditingId(null)}
      save={<SavePanel key={editing.id} channel={channelPath} spec={savable} suggestedName={suggestedName(channelName, editing.spec)} />}
    />
  );
}
