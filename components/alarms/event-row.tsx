"use client";

import Link from "next/link";
import { useState } from "react";
import { durationText, eventSummary } from "@/lib/alarms/describe";
import type { AlarmEventView } from "@/lib/protocol";
import { AckForm } from "./ack-form";
import { SeverityBadge, StateBadge } from "./alarm-badges";
import { formatDateTime } from "@/lib/format/date-time";

/** One alarm event: what, where, when, how far past the limit, and its acknowledgement (or the form to give one). */
export function EventRow({ event, showChannel = true }: { event: AlarmEventView; showChannel?: boolean }) {
  const [acking, setAcking] = useState(false);
  const lasted = event.clearedAt ? Date.parse(event.clearedAt) - Date.parse(event.raisedAt) : null;
  return (
    <li
      data-testid="alarm-event"
      data-id={event.id}
      data-kind={event.kind}
      data-state={event.state}
      data-acknowledged={String(event.acknowledgedAt !== null)}
      className={`px-3 py-2 text-sm ${event.kind === "masked" ? "border-l-2 border-dashed border-fault/70" : event.state === "raised" ? "border-l-4 border-fault" : "border-l-4 border-transparent"}`}
    >
      <div className="flex flex-wrap items-center gap-x-2 gap-y-1">
        <StateBadge event={event} />
        <SeverityBadge severity={event.severity} />
        <span className="font-medium">{event.ruleName}</span>
        {showChannel && (
          <Link href={`/channels/${event.channel}`} className="num text-xs text-slate-500 hover:underline">
            {event.channel}
          </Link>
        )}
        <span className="num ml-auto text-xs text-slate-500">
          {formatDateTime(event.raisedAt)}
          {lasted !== null && <> · lasted {durationText(lasted)}</>}
        </span>
      </div>
      <p className="mt-0.5 text-slate-700 dark:text-slate-300">
        {eventSummary(event)}
        {event.revisionId !== null && <span className="text-xs text-slate-500"> Production filter: revision {event.revisionId}.</span>}
      </p>
      {event.acknowledgedAt ? (
        <p className="mt-0.5 text-xs text-slate-500" data-testid="acknowledgement">
          Acknowledged by {event.acknowledgedBy} at {formatDateTime(event.acknowledgedAt)}: “{event.comment}”
        </p>
      ) : acking ? (
        <AckForm eventId={event.id} onDone={() => setAcking(false)} />
      ) : (
        <button type="button" className="btn-quiet mt-1 py-0.5 text-xs" onClick={() => setAcking(true)}>
          Acknowledge…
        </button>
      )}
    </li>
  );
}

/** A list of events, or what it means that there are none. */
export function EventList({ events, empty, label, showChannel }: { events: AlarmEventView[]; empty: string; label: string; showChannel?: boolean }) {
  if (events.length === 0) return <p className="px-3 py-2 text-sm text-slate-500">{empty}</p>;
  return (
    <ul aria-label={label} className="divide-y divide-slate-100 dark:divide-slate-800">
      {events.map((e) => (
        <EventRow key={e.id} event={e} showChannel={showChannel} />
      ))}
    </ul>
  );
}
