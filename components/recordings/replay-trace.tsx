"use client";

import { useMemo, useState } from "react";
import type uPlot from "uplot";
import type { ChartSource } from "@/components/charts/sources";
import { UPlotChart } from "@/components/charts/uplot-chart";
import { useTraceMarks } from "@/components/annotations/trace-marks";
import { TraceToggles } from "@/components/bench/trace-toggles";
import { decimateMinMax } from "@/lib/bench/decimate";
import type { ColumnView } from "@/lib/bench/ring-buffer";
import { formatDuration } from "@/lib/recordings/format";

export interface ReplayTrace {
  id: string;
  label: string;
  color: string;
  samples: Float64Array;
  visible: boolean;
}

/** Spans the engineer can look at, in s; 0 means the whole recording. */
const SPANS = [0, 60, 10, 1, 0.1] as const;

/** Rows [from, to) of several equal-length traces at fs, x in s from the first sample. */
function windowSource(traces: ReplayTrace[], fs: number, from: number, to: number): ChartSource {
  const view: ColumnView = { length: traces[0]?.samples.length ?? 0, series: traces.length, x: (i) => i / fs, y: (s, i) => traces[s].samples[i] };
  return {
    subscribe: () => () => {},
    snapshot: (widthPx) => decimateMinMax(view, from, to, Math.max(1, Math.round(widthPx))) as uPlot.AlignedData,
    xRange: () => [from / fs, Math.max(to - 1, from + 1) / fs],
  };
}

/**
 * The recording as traces (raw and candidate outputs), min/max-decimated to about two points per
 * pixel over the chosen span, with a start slider to move through a long capture.
 */
export function ReplayTraceChart({ traces, sampleRateHz, unit, onToggle }: { traces: ReplayTrace[]; sampleRateHz: number; unit: string; onToggle?: (id: string, visible: boolean) => void }) {
  const n = traces[0]?.samples.length ?? 0;
  const duration = n / sampleRateHz;
  const [span, setSpan] = useState<number>(0);
  const [start, setStart] = useState(0);
  const spanSamples = span === 0 ? n : Math.min(n, Math.round(span * sampleRateHz));
  const from = Math.min(Math.round(start * sampleRateHz), n - spanSamples);
  const source = useMemo(() => windowSource(traces, sampleRateHz, from, from + spanSamples), [traces, sampleRateHz, from, spanSamples]);

  return (
    <section aria-label="Recorded traces" className="card overflow-hidden">
      <div className="flex flex-wrap items-center gap-x-4 gap-y-2 border-b border-slate-200 px-4 py-2.5 dark:border-slate-800">
        <h2 className="font-medium">Traces</h2>
        <label className="flex items-center gap-1.5 text-sm">
          <span className="text-slate-500">Span</span>
          <select aria-label="Span" className="field w-auto py-1" value={span} onChange={(e) => setSpan(Number(e.target.value))}>
            {SPANS.filter((s) => s === 0 || s < duration).map((s) => (
              <option key={s} value={s}>
                {s === 0 ? `Whole (${formatDuration(duration)})` : formatDuration(s)}
              </option>
            ))}
          </select>
        </label>
        {span !== 0 && (
          <label className="flex items-center gap-1.5 text-sm">
            <span className="text-slate-500">From</span>
            <input
              aria-label="Start of the span (s)"
              type="range"
              min={0}
              max={Math.max(0, duration - span)}
              step={span / 10}
              value={from / sampleRateHz}
              onChange={(e) => setStart(Number(e.target.value))}
            />
            <span className="num w-20 text-xs">{(from / sampleRateHz).toFixed(3)} s</span>
          </label>
        )}
        <p className="ml-auto hidden text-xs text-slate-500 xl:block">Drag to zoom · shift-drag to pan · double-click to reset</p>
      </div>
      <TraceToggles traces={traces} onToggle={onToggle} />
      <div className="p-3">
        <div className="rounded-md bg-canvas p-2">
          <UPlotChart
            label="Recorded traces against time from the first sample"
            testId="recording-chart"
            series={traces.map((t) => ({ label: t.label, color: t.color, unit, show: t.visible, width: 1 }))}
            source={source}
            x={{ kind: "linear", label: "Time (s)", unit: "s" }}
            axes={[{ scale: "y", label: unit }]}
            height={320}
            onToggle={(i, show) => traces[i] && onToggle?.(traces[i].id, show)}
            marks={useTraceMarks()}
          />
        </div>
      </div>
    </section>
  );
}
