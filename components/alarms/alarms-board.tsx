"use client";

import { useMemo, useState } from "react";
import { Notice } from "@/components/ui/notice";
import type { EventFilter } from "@/lib/alarms/view";
import { ALARM_KINDS, ALARM_SEVERITIES, ALARM_STATES } from "@/lib/protocol";
import { useAlarmEvents, type FeedLink } from "./alarm-feed";
import { EventList } from "./event-row";

export interface ChannelOption {
  path: string;
  name: string;
  unit: string;
  rigKey: string;
  rigName: string;
}

const KIND_LABEL = { limit: "limit alarms", masked: "filter hid an excursion" } as const;

/**
 * The Alarms page's lists: what is open (raised, or cleared and not yet acknowledged) first, then
 * the history, both narrowed by rig, channel, severity and kind; the history also by state.
 */
export function AlarmsBoard({ channels, initial }: { channels: ChannelOption[]; initial: EventFilter }) {
  const [filter, setFilter] = useState<EventFilter>(initial);
  const set = (change: Partial<EventFilter>) => setFilter((f) => ({ ...f, ...change }));
  const rigs = useMemo(() => [...new Map(channels.map((c) => [c.rigKey, c.rigName]))], [channels]);
  const shownChannels = channels.filter((c) => !filter.rig || c.rigKey === filter.rig);
  const { state, ...scope } = filter;
  const open = useAlarmEvents({ ...scope, state: "open" });
  const history = useAlarmEvents({ ...scope, state: state === "open" ? undefined : state });
  const openIds = new Set(open.events.map((e) => e.id));
  const past = history.events.filter((e) => !openIds.has(e.id));

  return (
    <div className="space-y-4">
      <form className="card flex flex-wrap items-end gap-3 p-3" aria-label="Alarm filters" onSubmit={(e) => e.preventDefault()}>
        <Select label="Rig" value={filter.rig} onChange={(rig) => set({ rig, channel: undefined })} options={rigs.map(([key, name]) => [key, name])} />
        <Select label="Channel" value={filter.channel} onChange={(channel) => set({ channel })} options={shownChannels.map((c) => [c.path, `${c.name} (${c.path})`])} />
        <Select label="Severity" value={filter.severity} onChange={(v) => set({ severity: ALARM_SEVERITIES.find((s) => s === v) })} options={ALARM_SEVERITIES.map((s) => [s, s])} />
        <Select label="Kind" value={filter.kind} onChange={(v) => set({ kind: ALARM_KINDS.find((k) => k === v) })} options={ALARM_KINDS.map((k) => [k, KIND_LABEL[k]])} />
        <Select label="State (history)" value={filter.state === "open" ? undefined : filter.state} onChange={(v) => set({ state: ALARM_STATES.find((s) => s === v) })} options={ALARM_STATES.map((s) => [s, s])} />
        <LinkState link={open.link} />
      </form>
      {(open.query.isError || history.query.isError) && (
        <Notice tone="warn" title="The stored alarms could not be loaded">
          {(open.query.error ?? history.query.error)?.message} Alarms pushed by the live service still appear below; stored ones come back when the database answers.
        </Notice>
      )}
      <section className="card overflow-hidden" aria-labelledby="open-h">
        <h2 id="open-h" className="border-b border-slate-200 px-3 py-2 font-medium dark:border-slate-800">
          Active <span className="text-sm font-normal text-slate-500">· raised, or cleared and waiting for an acknowledgement</span>
        </h2>
        <EventList label="Active alarms" events={open.events} empty={open.query.isPending ? "Loading…" : "Nothing is raised or waiting for an acknowledgement."} />
      </section>
      <section className="card overflow-hidden" aria-labelledby="history-h">
        <h2 id="history-h" className="border-b border-slate-200 px-3 py-2 font-medium dark:border-slate-800">
          History <span className="text-sm font-normal text-slate-500">· newest first, at most 200</span>
        </h2>
        <EventList label="Alarm history" events={past} empty={history.query.isPending ? "Loading…" : "No alarms match these filters yet."} />
      </section>
    </div>
  );
}

function Select({ label, value, onChange, options }: { label: string; value: string | undefined; onChange: (v: string | undefined) => void; options: Array<[string, string]> }) {
  return (
    <label className="text-sm">
      <span className="label">{label}</span>
      <select className="field w-auto py-1" value={value ?? ""} onChange={(e) => onChange(e.target.value || undefined)}>
        <option value="">all</option>
        {options.map(([v, text]) => (
          <option key={v} value={v}>
            {text}
          </option>
        ))}
      </select>
    </label>
  );
}

function LinkState({ link }: { link: FeedLink }) {
  const text = { connecting: "connecting to the live service…", live: "live: new alarms appear at once", reconnecting: "live service unreachable, retrying; lists refresh every 30 s", "signed-out": "signed out: reload to sign in" }[link];
  return (
    <p className={`ml-auto text-xs ${link === "live" ? "text-slate-500" : "text-fault"}`} data-testid="alarm-link" data-link={link}>
      {text}
    </p>
  );
}
