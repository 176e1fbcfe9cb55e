"use client";

import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import Link from "next/link";
import { useState } from "react";
import { Segmented } from "@/components/ui/segmented";
import type { FilterSpec } from "@/lib/dsp";
import { ApiError, createRevision, createSet, fetchSets, type SavedRevision } from "./api";
import { stateWord } from "@/lib/workflow";

/**
 * Saves a candidate's spec as a new coefficient set of this channel, or as a new revision of one of its
 * sets (checked against the latest revision the list showed), with notes; shows the result or the error.
 */
export function SavePanel({ channel, spec, suggestedName }: { channel: string; spec: FilterSpec | null; suggestedName: string }) {
  const [mode, setMode] = useState<"set" | "revision">("set");
  const [typedName, setTypedName] = useState<string | null>(null);
  const name = typedName ?? suggestedName;
  const [setId, setSetId] = useState("");
  const [notes, setNotes] = useState("");
  const queryClient = useQueryClient();
  const sets = useQuery({ queryKey: ["sets", channel], queryFn: () => fetchSets(channel), enabled: mode === "revision" });
  const chosen = sets.data?.find((s) => String(s.id) === setId);
  // The design the last save stored: "Saved" is said only while the design shown is still that one.
  const [savedText, setSavedText] = useState<string | null>(null);
  const changedSinceSave = savedText !== null && savedText !== JSON.stringify(spec);

  const save = useMutation<SavedRevision, Error, void>({
    mutationFn: async () => {
      if (!spec) throw new Error("Fix the design first: only a valid design can be saved.");
      const trimmedNotes = notes.trim() || undefined;
      if (mode === "set") {
        if (!name.trim()) throw new Error("Give the set a name.");
        return createSet({ channel, name: name.trim(), notes: trimmedNotes, spec });
      }
      if (!chosen) throw new Error("Pick the set to add a revision to.");
      return createRevision(chosen.id, { spec, notes: trimmedNotes, expectedLatestRevision: chosen.latestRevision });
    },
    onSuccess: () => {
      setSavedText(JSON.stringify(spec));
      return queryClient.invalidateQueries({ queryKey: ["sets", channel] });
    },
  });

  const fieldErrors = save.error instanceof ApiError ? save.error.fields : [];
  return (
    <section aria-label="Save" className="space-y-3 border-t border-slate-200 pt-4 dark:border-slate-800">
      <div className="flex items-center gap-3">
        <h3 className="font-medium">Save</h3>
        <Segmented
          label="Save as"
          value={mode}
          onChange={(m) => {
            setMode(m);
            save.reset();
          }}
          options={[
            { value: "set", label: "New set" },
            { value: "revision", label: "New revision" },
          ]}
        />
      </div>
      {mode === "set" ? (
        <div>
          <label htmlFor="save-name" className="label">
            Set name
          </label>
          <input id="save-name" className="field" value={name} onChange={(e) => setTypedName(e.target.value)} maxLength={120} />
        </div>
      ) : (
        <div>
          <label htmlFor="save-set" className="label">
            Set
          </label>
          {sets.isPending ? (
            <p className="text-sm text-slate-500">Loading this channel&apos;s sets…</p>
          ) : sets.isError ? (
            <p role="alert" className="text-sm text-red-700 dark:text-red-300">
              The sets could not be loaded: {sets.error.message}{" "}
              <button type="button" className="underline" onClick={() => void sets.refetch()}>
                Try again
              </button>
            </p>
          ) : sets.data.length === 0 ? (
            <p className="text-sm text-slate-500">This channel has no sets yet. Save a new set instead.</p>
          ) : (
            <select id="save-set" className="field" value={setId} onChange={(e) => setSetId(e.target.value)}>
              <option value="">Choose a set…</option>
              {sets.data.map((s) => (
                <option key={s.id} value={String(s.id)}>
                  {s.name} · revision {s.latestRevision} · {stateWord(s.status)}
                </option>
              ))}
            </select>
          )}
        </div>
      )}
      <div>
        <label htmlFor="save-notes" className="label">
          Notes
        </label>
        <textarea id="save-notes" className="field" rows={2} value={notes} onChange={(e) => setNotes(e.target.value)} placeholder="Why this filter, what you checked" />
      </div>
      <button type="button" className="btn-primary" disabled={save.isPending || !spec} onClick={() => save.mutate()}>
        {save.isPending ? "Saving…" : mode === "set" ? "Save as a new set" : "Save as a new revision"}
      </button>
      {!spec && <p className="text-xs text-slate-500">Save waits for a valid design: fix the values marked in red first.</p>}
      {save.isSuccess && (
        <p role="status" className={`text-sm ${changedSinceSave ? "text-slate-600 dark:text-slate-300" : "text-emerald-800 dark:text-emerald-300"}`}>
          {changedSinceSave ? `The design changed after it was saved as revision ${save.data.revision}; the one shown now is not saved.` : `Saved as revision ${save.data.revision}.`}{" "}
          <Link className="font-medium underline" href={`/sets/${save.data.setId}`}>
            Open the set
          </Link>
        </p>
      )}
      {save.isError && (
        <div role="alert" className="text-sm text-red-700 dark:text-red-300">
          <p>Not saved: {save.error.message}</p>
          {fieldErrors.length > 0 && (
            <ul className="mt-1 list-disc pl-5 text-xs">
              {fieldErrors.map((f) => (
                <li key={f.path}>
                  {f.path}: {f.message}
                </li>
              ))}
            </ul>
          )}
        </div>
      )}
    </section>
  );
}
