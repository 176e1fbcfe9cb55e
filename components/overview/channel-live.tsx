"use client";

import Link from "next/link";
import { useRouter } from "next/navigation";
import { useEffect, type ReactNode } from "react";
import { faultSummary, LOST_BATCHES_MEANING, lostBatchesText, sampleAge } from "./format";
import { Sparkline } from "./sparkline";
import { useLiveOverview } from "./use-live-overview";
import { useClock } from "@/components/hooks/use-clock";

/** A production revision the page could name: its set and revision number. */
export interface KnownRevision {
  setId: number;
  setName: string;
  revision: number;
}

/**
 * The live part of one channel card: device state in words and a dot, last-sample age, production
 * revision, the last 30 s as a sparkline and fault counts (the alarm line is its own component).
 * Red only for a device offline and for faults.
 */
export function ChannelLive({ path, unit, revisions }: { path: string; unit: string; revisions: Record<string, KnownRevision> }) {
  const query = useLiveOverview();
  const clock = useClock(1000);
  if (query.isPending) {
    return <LiveShell state="loading">Loading live state…</LiveShell>;
  }
  if (query.isError && !query.data) {
    return <LiveShell state="unavailable">Live state unavailable (see above).</LiveShell>;
  }
  const live = query.data.channels[path];
  if (!live) return <LiveShell state="unavailable">The live service does not know this channel yet; it reads channels when it starts.</LiveShell>;
  const ageMs = live.lastSampleAt === null ? null : query.data.now - live.lastSampleAt + (Math.max(clock, query.dataUpdatedAt) - query.dataUpdatedAt);
  const age = sampleAge(ageMs);
  // Lost batches (sequence gaps) are counted apart: they are the link's loss, not a bad message.
  const { seq_gap: gaps = 0, ...refused } = live.faults;
  const faults = faultSummary(refused);
  return (
    <div data-testid="channel-live" data-online={String(live.online)} className="mt-2 space-y-1.5 text-xs">
      {query.isError && <p className="text-slate-500">Showing the last state received.</p>}
      <div className="flex items-center justify-between gap-2">
        <div className="space-y-0.5">
          <DeviceState online={live.online} />
          <p className={`num ${age.stale ? "font-medium text-slate-700 dark:text-slate-200" : "text-slate-500"}`} data-testid="sample-age">
            {age.text}
          </p>
        </div>
        {live.spark ? <Sparkline spark={live.spark} unit={unit} /> : <span className="text-slate-400">no trace yet</span>}
      </div>
      <Production id={live.productionRevisionId} revisions={revisions} />
      {gaps > 0 && (
        <p className="num text-slate-500" data-testid="gap-count" title={LOST_BATCHES_MEANING}>
          {lostBatchesText(gaps, live.faultsSince)}
        </p>
      )}
      {faults && (
        <p className="num text-fault" data-testid="fault-counts">
          refused: {faults}
        </p>
      )}
    </div>
  );
}

function LiveShell({ state, children }: { state: "loading" | "unavailable"; children: ReactNode }) {
  return (
    <p data-testid="channel-live" data-state={state} role="status" className="mt-2 text-xs text-slate-500">
      {children}
    </p>
  );
}

function DeviceState({ online }: { online: boolean | null }) {
  const [label, dot] =
    online === true
      ? ["online", "bg-brand-500"]
      : online === false
        ? ["offline", "bg-fault"]
        : ["status unknown", "border border-slate-400 bg-transparent"];
  return (
    <p className={`flex items-center gap-1.5 font-medium ${online === false ? "text-fault" : ""}`} data-testid="device-state">
      <span aria-hidden className={`inline-block size-2 rounded-full ${dot}`} />
      {label}
    </p>
  );
}

function Production({ id, revisions }: { id: string | null; revisions: Record<string, KnownRevision> }) {
  const router = useRouter();
  const known = id === null ? undefined : revisions[id];
  // A revision promoted since the page loaded: ask the server once for its set and number.
  useEffect(() => {
    if (id !== null && !known) router.refresh();
  }, [id, known, router]);
  if (id === null) return <p className="text-slate-500">production: none</p>;
  return (
    <p className="text-slate-600 dark:text-slate-300">
      production:{" "}
      {known ? (
        <Link href={`/sets/${known.setId}`} className="font-medium underline decoration-production decoration-2 underline-offset-2">
          {known.setName} r{known.revision}
        </Link>
      ) : (
        <span className="num">revision {id}</span>
      )}
    </p>
  );
}
