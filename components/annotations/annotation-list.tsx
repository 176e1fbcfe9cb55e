"use client";

import { useQueryClient } from "@tanstack/react-query";
import { useState } from "react";
import { ApiError } from "@/components/bench/api";
import { durationText } from "@/lib/alarms/describe";
import { roleAtLeast, type Role } from "@/lib/auth/roles";
import { deleteAnnotation, type Annotation } from "./api";
import { formatDateTime } from "@/lib/format/date-time";

export interface Viewer {
  id: number;
  role: Role;
}

/** Annotations, newest first, each with its time or span, author and (for its author or a lead) delete. */
export function AnnotationList({ notes, viewer, showChannel, empty }: { notes: Annotation[]; viewer: Viewer; showChannel?: boolean; empty: string }) {
  const client = useQueryClient();
  const [error, setError] = useState<string | null>(null);
  async function remove(id: number) {
    setError(null);
    try {
      await deleteAnnotation(id);
      await client.invalidateQueries({ queryKey: ["annotations"] });
    } catch (err) {
      setError(err instanceof ApiError ? err.message : "The annotation could not be deleted.");
    }
  }
  if (notes.length === 0) return <p className="text-sm text-slate-500">{empty}</p>;
  return (
    <>
      {error && <p role="alert" className="text-xs text-fault">{error}</p>}
      <ul aria-label="Annotations" className="divide-y divide-slate-100 text-sm dark:divide-slate-800">
        {notes.map((n) => (
          <li key={n.id} data-testid="annotation" className="flex flex-wrap items-baseline gap-x-2 py-1.5">
            <span className="num text-xs text-slate-500">
              {formatDateTime(n.at)}
              {n.endAt && <> → {formatDateTime(n.endAt)} ({durationText(Date.parse(n.endAt) - Date.parse(n.at))})</>}
            </span>
            {showChannel && <span className="num text-xs text-slate-500">{n.channel}</span>}
            <span className="min-w-0 flex-1">{n.text}</span>
            <span className="text-xs text-slate-500">{n.authorName}</span>
            {(n.createdBy === viewer.id || roleAtLeast(viewer.role, "lead")) && (
              <button type="button" className="text-xs text-slate-500 underline hover:text-fault" onClick={() => remove(n.id)} aria-label={`Delete the annotation “${n.text}”`}>
                delete
              </button>
            )}
          </li>
        ))}
      </ul>
    </>
  );
}
