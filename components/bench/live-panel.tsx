"use client";

import { useEffect, useMemo, useState } from "react";
import { UPlotChart, type ChartSeries } from "@/components/charts/uplot-chart";
import { liveSource } from "@/components/charts/sources";
import { useTraceMarks } from "@/components/annotations/trace-marks";
import { Swatch } from "@/components/ui/swatch";
import { withUnit } from "@/lib/bench/format";
import type { LiveStore } from "@/lib/bench/live-store";
import { ConnectionBadge } from "./connection-badge";
import { TraceToggles } from "./trace-toggles";
import type { LiveStatus } from "./use-live-channel";
import { useLatest } from "@/components/hooks/use-latest";

export interface TraceInfo {
  /** Trace id in frames ("raw", "production" or a candidate id). */
  id: string;
  slot: number;
  label: string;
  color: string;
  visible: boolean;
}

const WINDOWS = [1, 2, 5, 10, 20, 30, 60] as const;

/**
 * The live traces: a time window of 1–60 s, pause, per-trace visibility, y auto-range or a manual range,
 * values under the cursor with units, the link state, and a readout of the newest values (data-latest).
 */
export function LivePanel({
  store,
  status,
  traces,
  unit,
  onToggle,
}: {
  store: LiveStore;
  status: LiveStatus;
  traces: TraceInfo[];
  unit: string;
  onToggle: (id: string, visible: boolean) => void;
}) {
  const [windowSeconds, setWindowSeconds] = useState(10);
  const [paused, setPaused] = useState(false);
  const [zoomed, setZoomed] = useState(false);
  const [manualY, setManualY] = useState(false);
  const [yMin, setYMin] = useState("");
  const [yMax, setYMax] = useState("");
  const windowRef = useLatest(windowSeconds);
  const slotsRef = useLatest(traces.map((t) => t.slot));
  const source = useMemo(() => liveSource(store, slotsRef, windowRef), [store, slotsRef, windowRef]);
  const series: ChartSeries[] = traces.map((t) => ({ label: t.label, color: t.color, unit, show: t.visible, width: 1 }));
  const lo = Number(yMin);
  const hi = Number(yMax);
  const yRange: [number, number] | null = manualY && yMin !== "" && yMax !== "" && lo < hi ? [lo, hi] : null;
  const frozen = paused || zoomed;

  return (
    <section aria-label="Live traces" className="card overflow-hidden">
      <div className="flex flex-wrap items-center gap-x-4 gap-y-2 border-b border-slate-200 px-4 py-2.5 dark:border-slate-800">
        <h2 className="font-medium">Live traces</h2>
        <ConnectionBadge status={status} paused={frozen} />
        <label className="flex items-center gap-1.5 text-sm">
          <span className="text-slate-500">Window</span>
          <select aria-label="Time window" className="field w-auto py-1" value={windowSeconds} onChange={(e) => setWindowSeconds(Number(e.target.value))}>
            {WINDOWS.map((w) => (
              <option key={w} value={w}>
                {w} s
              </option>
            ))}
          </select>
        </label>
        <button
          type="button"
          className="btn-quiet py-1"
          aria-pressed={frozen}
          onClick={() => {
            if (frozen) {
              setPaused(false);
              setZoomed(false);
            } else setPaused(true);
          }}
        >
          {frozen ? "Resume" : "Pause"}
        </button>
        <div className="flex items-center gap-1.5 text-sm">
          <label className="flex items-center gap-1.5">
            <input type="checkbox" checked={manualY} onChange={(e) => setManualY(e.target.checked)} />
            <span className="text-slate-500">Fixed y</span>
          </label>
          {manualY && (
            <>
              <input aria-label={`y minimum (${unit})`} className="field num w-20 py-1" type="number" value={yMin} onChange={(e) => setYMin(e.target.value)} placeholder="min" />
              <input aria-label={`y maximum (${unit})`} className="field num w-20 py-1" type="number" value={yMax} onChange={(e) => setYMax(e.target.value)} placeholder="max" />
              <span className="text-slate-500">{unit}</span>
            </>
          )}
        </div>
        <p className="ml-auto hidden text-xs text-slate-500 xl:block">Drag to zoom · shift-drag to pan · double-click to follow live</p>
      </div>
      <TraceToggles traces={traces} onToggle={onToggle} />
      <div className="p-3">
        <div className="rounded-md bg-canvas p-2">
          <UPlotChart
            label={`Live traces over the last ${windowSeconds} s`}
            testId="live-chart"
            series={series}
            source={source}
            x={{ kind: "time", label: "Time (UTC)", unit: "s" }}
            axes={[{ scale: "y", label: unit }]}
            height={320}
            yRange={yRange}
            paused={frozen}
            onZoom={setZoomed}
            onToggle={(i, show) => traces[i] && onToggle(traces[i].id, show)}
            marks={useTraceMarks()}
          />
        </div>
        <LiveReadout store={store} traces={traces} unit={unit} />
      </div>
    </section>
  );
}

/** The newest value of each trace, refreshed four times a second; data-latest holds them as JSON for tests and tools. */
function LiveReadout({ store, traces, unit }: { store: LiveStore; traces: TraceInfo[]; unit: string }) {
  const [latest, setLatest] = useState<readonly (number | null)[]>([]);
  const [frames, setFrames] = useState(0);
  useEffect(() => {
    const id = setInterval(() => {
      setLatest([...store.latest()]);
      setFrames(store.frames);
    }, 250);
    return () => clearInterval(id);
  }, [store]);
  const values = Object.fromEntries(traces.map((t) => [t.id, latest[t.slot] ?? null]));
  return (
    <dl data-testid="live-readout" data-latest={JSON.stringify(values)} data-frames={frames} className="mt-2 flex flex-wrap gap-x-5 gap-y-1 text-xs">
      {traces.map((t) => (
        <div key={t.id} className="flex items-center gap-1.5">
          <dt className="flex items-center gap-1.5 text-slate-500">
            <Swatch color={t.color} />
            {t.label}
          </dt>
          <dd className="num text-slate-800 dark:text-slate-200">{withUnit(values[t.id], unit, 4)}</dd>
        </div>
      ))}
    </dl>
  );
}
