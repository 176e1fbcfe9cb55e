"use client";

import { useQuery } from "@tanstack/react-query";
import type { ReactNode } from "react";
import { fetchAlarmEvents } from "@/components/alarms/api";
import { traceMarks } from "@/lib/alarms/marks";
import { fetchAnnotations } from "./api";
import { AnnotationsPanel } from "./annotations-panel";
import type { Viewer } from "./annotation-list";
import { TraceMarks } from "./trace-marks";

/**
 * A recording with its channel's annotations and alarms: marks on the replayed traces (x in s from
 * the recording's first sample) and the annotations of its span to read and add. Needs the
 * recording's start time; without one, annotations (times on the channel) cannot be placed.
 */
export function RecordingNotes({
  channel,
  startedAt,
  durationMs,
  viewer,
  children,
}: {
  channel: { path: string; name: string };
  startedAt: string | null;
  durationMs: number;
  viewer: Viewer;
  children: ReactNode;
}) {
  const start = startedAt ? Date.parse(startedAt) : null;
  const within = start === null ? null : { from: new Date(start).toISOString(), to: new Date(start + durationMs).toISOString() };
  const query = within ? { channel: channel.path, ...within, limit: 500 } : null;
  const notes = useQuery({ queryKey: ["annotations", query], queryFn: () => fetchAnnotations(query ?? {}), enabled: query !== null });
  const alarms = useQuery({ queryKey: ["alarm-events", query], queryFn: () => fetchAlarmEvents({ channel: channel.path, ...within, limit: 500 }), enabled: query !== null });
  const marks = start === null ? [] : traceMarks(notes.data ?? [], alarms.data ?? [], start, start + durationMs);
  return (
    <>
      <TraceMarks marks={marks}>{children}</TraceMarks>
      {within ? (
        <AnnotationsPanel channels={[channel]} viewer={viewer} within={within} title="Annotations in this recording" />
      ) : (
        <p className="text-sm text-slate-500">This recording has no start time (its CSV had no timestamps), so the channel&apos;s annotations and alarms cannot be placed on it.</p>
      )}
    </>
  );
}
