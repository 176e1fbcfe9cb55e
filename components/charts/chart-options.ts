import uPlot from "uplot";
import { signedTrim } from "@/lib/format/units";
import type { ChartAxis, ChartRefs, ChartSeries, UPlotChartProps } from "./chart-types";

const AXIS_STROKE = "#94a3b8";
const GRID = { stroke: "rgba(148, 163, 184, 0.14)", width: 1 };
const TICKS = { stroke: "rgba(148, 163, 184, 0.3)", width: 1 };

const pad = (n: number, width = 2) => String(n).padStart(width, "0");

/** UTC clock time of t s since the epoch (the zone of every time the app shows): hh:mm:ss, with .mmm when asked. */
export function clock(t: number, ms: boolean): string {
  const d = new Date(t * 1000);
  const base = `${pad(d.getUTCHours())}:${pad(d.getUTCMinutes())}:${pad(d.getUTCSeconds())}`;
  return ms ? `${base}.${pad(d.getUTCMilliseconds(), 3)}` : base;
}

/** A value with its unit to 4 significant figures, with a true minus sign; "—" for a gap. */
export function valueText(v: number | null, unit: string): string {
  return v == null ? "—" : `${signedTrim(v, 4)} ${unit}`.trim();
}

/** An x value as the chart shows it: a clock time with ms on a time axis, else the value with its unit. */
export function xText(p: Pick<UPlotChartProps, "x">, v: number | null): string {
  return p.x.kind === "time" ? (v == null ? "—" : clock(v, true)) : valueText(v, p.x.unit);
}

export function seriesOptions(s: ChartSeries): uPlot.Series {
  return {
    label: s.label,
    stroke: s.color,
    width: s.width ?? 1.25,
    dash: s.dash,
    scale: s.scale ?? "y",
    show: s.show ?? true,
    spanGaps: false,
    points: { show: false },
    value: (_u, v) => valueText(v, s.unit),
  };
}

const axis = (a: Partial<uPlot.Axis>): uPlot.Axis => ({ stroke: AXIS_STROKE, grid: GRID, ticks: TICKS, font: "11px var(--font-mono), monospace", labelFont: "11px var(--font-inter), sans-serif", ...a });

/** The x range: the engineer's zoom, else the live (or paused) window, else the data's own extent. */
function xRange(refs: ChartRefs, log: boolean) {
  return (_u: uPlot, min: number | null, max: number | null): uPlot.Range.MinMax => {
    if (refs.zoomed.current && min != null && max != null && max > min) return [min, max];
    const p = refs.props.current;
    const live = p.source.xRange?.() ?? null;
    if (live) return p.paused ? (refs.frozen.current ?? live) : live;
    if (log) {
      // A log axis needs a positive range: an empty plot shows one to a thousand.
      if (min == null || max == null || !(min > 0) || !(max > min)) return [1, 1000];
      // The data's own extent, so a frequency axis ends where the response does (just below Nyquist), not at the next decade.
      return [min, max];
    }
    if (min == null || max == null) return [0, 1];
    return min === max ? [min - 1, max + 1] : [min, max];
  };
}

/** An automatic y range with 8 % headroom that never reaches below `floor`. */
function autoRange(floor: number | undefined) {
  return (_u: uPlot, min: number | null, max: number | null): uPlot.Range.MinMax => {
    if (min == null || max == null) return [-1, 1];
    const lo = floor === undefined ? min : Math.min(Math.max(min, floor), max);
    return uPlot.rangeNum(lo, max, 0.08, true);
  };
}

function yAxis(refs: ChartRefs, a: ChartAxis, index: number): uPlot.Axis {
  return axis({
    scale: a.scale,
    label: a.label,
    side: a.side === "right" ? 1 : 3,
    grid: a.side === "right" ? { show: false } : GRID,
    size: 56,
    values: a.format ? (_u: uPlot, splits: number[]) => splits.map((v) => refs.props.current.axes[index]?.format?.(v) ?? String(v)) : undefined,
  });
}

/**
 * The uPlot options of a chart `width` px wide from its props at creation (`x`, `axes` and the series then);
 * everything that changes later (y range, pause, zoom, series shown) is read through `refs` when uPlot asks.
 */
export function buildOptions(p: UPlotChartProps, width: number, refs: ChartRefs, plugins: uPlot.Plugin[]): uPlot.Options {
  const log = p.x.kind === "log";
  const scales: uPlot.Scales = {
    // Time is drawn on a plain numeric scale with our own clock labels: uPlot's calendar time axis
    // cost about half the frame rate at 1,500 px in headless Chromium (tests/bench/chart.bench.ts).
    x: log ? { time: false, distr: 3, log: 10, range: xRange(refs, true) } : { time: false, range: xRange(refs, false) },
  };
  for (const a of p.axes) {
    const auto = autoRange(a.floor);
    scales[a.scale] ??= { range: a.scale === "y" ? (u, min, max) => refs.props.current.yRange ?? auto(u, min, max) : auto };
  }
  return {
    width,
    height: p.height,
    scales,
    series: [{ label: p.x.label, value: (_u, v) => xText(p, v) }, ...p.series.map(seriesOptions)],
    axes: [
      axis({
        label: p.x.label,
        scale: "x",
        space: log ? 40 : p.x.kind === "time" ? 90 : 70,
        // Ticks less than a second apart (a 1 s window, a zoom) get milliseconds, so no two labels read the same.
        values: p.x.kind === "time" ? (_u: uPlot, splits: number[]) => splits.map((v) => clock(v, splits.length > 1 && splits[1] - splits[0] < 1)) : undefined,
      }),
      ...p.axes.map((a, i) => yAxis(refs, a, i)),
    ],
    cursor: { drag: { x: true, y: false, setScale: true }, points: { size: 5 } },
    legend: { show: true, live: true },
    hooks: {
      setSeries: [
        (_u, idx, opts) => {
          if (idx != null && idx > 0 && opts.show !== undefined) refs.props.current.onToggle?.(idx - 1, opts.show);
        },
      ],
    },
    plugins,
  };
}
