"use client";

import { useQuery } from "@tanstack/react-query";
import Link from "next/link";
import type { ReactNode } from "react";
import { fetchAnnotations } from "@/components/annotations/api";
import { AnnotationForm } from "@/components/annotations/annotation-form";
import { AnnotationList, type Viewer } from "@/components/annotations/annotation-list";
import { TraceMarks } from "@/components/annotations/trace-marks";
import { traceMarks } from "@/lib/alarms/marks";
import { AlarmFeed, useAlarmEvents } from "./alarm-feed";
import { EventList } from "./event-row";
import { useClock } from "@/components/hooks/use-clock";

interface BenchChannelRef {
  path: string;
  name: string;
}

/** How many of the channel's newest annotations and alarms the bench shows and marks. */
const RECENT = 50;
/** Open alarms listed in the strip; the rest are on the Alarms page. */
const SHOWN = 5;

/**
 * Alarms and annotations around the bench: the live traces inside get the channel's annotations and
 * alarms as marks, and a strip below lists what is open and recent, acknowledges, and adds notes.
 */
export function BenchAlarms({ channel, viewer, port, wsPath, children }: { channel: BenchChannelRef; viewer: Viewer; port: number; wsPath: string; children: ReactNode }) {
  return (
    <AlarmFeed port={port} wsPath={wsPath}>
      <OpenAlarmsLine path={channel.path} />
      <ChannelMarks path={channel.path}>{children}</ChannelMarks>
      <BenchStrip channel={channel} viewer={viewer} />
    </AlarmFeed>
  );
}

function useChannelNotes(path: string) {
  const query = { channel: path, limit: RECENT };
  return useQuery({ queryKey: ["annotations", query], queryFn: () => fetchAnnotations(query), refetchInterval: 10_000 });
}

function ChannelMarks({ path, children }: { path: string; children: ReactNode }) {
  const notes = useChannelNotes(path);
  const alarms = useAlarmEvents({ channel: path }, RECENT);
  const now = useClock(1000);
  return <TraceMarks marks={traceMarks(notes.data ?? [], alarms.events, 0, now)}>{children}</TraceMarks>;
}

/** One red line above the traces while something is open on the channel, pointing to the strip below. */
function OpenAlarmsLine({ path }: { path: string }) {
  const open = useAlarmEvents({ channel: path, state: "open" });
  if (open.events.length === 0) return null;
  const raised = open.events.filter((e) => e.state === "raised").length;
  return (
    <p role="status" className="text-sm font-medium text-fault" data-testid="bench-open-alarms">
      <span aria-hidden className="mr-1.5 inline-block size-2 rounded-full bg-fault align-middle" />
      {raised > 0 ? `${raised} raised` : "nothing raised"} · {open.events.length - raised} cleared and waiting for an acknowledgement ·{" "}
      <a href="#bench-alarms" className="underline">
        see the alarms below
      </a>
    </p>
  );
}

function BenchStrip({ channel, viewer }: { channel: BenchChannelRef; viewer: Viewer }) {
  const open = useAlarmEvents({ channel: channel.path, state: "open" });
  const recent = useAlarmEvents({ channel: channel.path }, RECENT);
  const notes = useChannelNotes(channel.path);
  const openIds = new Set(open.events.map((e) => e.id));
  const past = recent.events.filter((e) => !openIds.has(e.id)).slice(0, 8);
  return (
    <section id="bench-alarms" aria-label="Alarms and annotations" className="card grid gap-4 p-3 lg:grid-cols-2">
      <div className="min-w-0 space-y-2">
        <div className="flex items-baseline gap-2">
          <h2 className="font-medium">Alarms on this channel</h2>
          <Link href={`/alarms?channel=${encodeURIComponent(channel.path)}`} className="ml-auto text-xs text-slate-500 hover:underline">
            all of this channel&apos;s alarms and rules
          </Link>
        </div>
        <EventList label="Open alarms on this channel" events={open.events.slice(0, SHOWN)} empty="Nothing raised or waiting for an acknowledgement." showChannel={false} />
        {open.events.length > SHOWN && <p className="text-xs text-slate-500">and {open.events.length - SHOWN} more on the Alarms page.</p>}
        {past.length > 0 && (
          <details>
            <summary className="cursor-pointer text-xs text-slate-500">Recent ({past.length}), including where the filter hid an excursion</summary>
            <EventList label="Recent alarms on this channel" events={past} empty="" showChannel={false} />
          </details>
        )}
      </div>
      <div className="min-w-0 space-y-2">
        <h2 className="font-medium">Annotations</h2>
        <AnnotationForm channels={[channel]} />
        <AnnotationList notes={(notes.data ?? []).slice(0, 10)} viewer={viewer} empty={notes.isPending ? "Loading…" : "No annotations on this channel yet."} />
      </div>
    </section>
  );
}
