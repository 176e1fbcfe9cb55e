"use client";

import { useQuery } from "@tanstack/react-query";
import { useState } from "react";
import { Notice } from "@/components/ui/notice";
import { fetchAnnotations, type AnnotationQuery } from "./api";
import { AnnotationForm } from "./annotation-form";
import { AnnotationList, type Viewer } from "./annotation-list";

/**
 * Annotations to read, search and add: every channel's (the Alarms page) or one channel's within a
 * time window (a recording). Search matches every word of the text.
 */
export function AnnotationsPanel({
  channels,
  viewer,
  within,
  title = "Annotations",
}: {
  channels: { path: string; name: string }[];
  viewer: Viewer;
  /** Only annotations reaching into this window (ISO times), e.g. a recording's span. */
  within?: { from: string; to: string };
  title?: string;
}) {
  const [q, setQ] = useState("");
  const single = channels.length === 1 ? channels[0].path : undefined;
  const query: AnnotationQuery = { channel: single, q: q.trim() || undefined, ...within, limit: 200 };
  const notes = useQuery({ queryKey: ["annotations", query], queryFn: () => fetchAnnotations(query), placeholderData: (previous) => previous });
  return (
    <section className="card space-y-3 p-3" aria-labelledby="notes-h">
      <div className="flex flex-wrap items-center gap-3">
        <h2 id="notes-h" className="font-medium">
          {title}
        </h2>
        <input type="search" aria-label="Search annotations" className="field ml-auto w-64 py-1" placeholder="Search the notes" maxLength={120} value={q} onChange={(e) => setQ(e.target.value)} />
      </div>
      <AnnotationForm channels={channels} defaultAt={within ? Date.parse(within.from) : undefined} />
      {notes.isError ? (
        <Notice tone="error" title="Annotations could not be loaded">{notes.error.message}</Notice>
      ) : (
        <AnnotationList notes={notes.data ?? []} viewer={viewer} showChannel={!single} empty={notes.isPending ? "Loading…" : q ? "No annotation matches." : "No annotations yet."} />
      )}
    </section>
  );
}
