"use client";

import { useEffect, useInsertionEffect, useRef } from "react";
import uPlot from "uplot";
import "uplot/dist/uPlot.min.css";
import "./chart.css";
import { trim } from "@/lib/format/units";
import type { ChartSource } from "./sources";

export interface ChartSeries {
  label: string;
  color: string;
  /** Unit shown with the value under the cursor. */
  unit: string;
  show?: boolean;
  width?: number;
  dash?: number[];
  /** y scale key; "y" (left axis) unless given. */
  scale?: string;
}

export interface ChartAxis {
  scale: string;
  label: string;
  side?: "left" | "right";
  /** Tick labels from values (e.g. samples shown as ms on a second axis). */
  format?: (v: number) => string;
  /** The auto range never reaches below this (e.g. −120 dB, so deep notches do not flatten a Bode plot). */
  floor?: number;
}

/** A labelled vertical marker (e.g. a spectral peak) drawn over the plot; with endX, a shaded span. */
export interface ChartMark {
  x: number;
  label: string;
  endX?: number;
  /** "alarm" draws it in the alarm red. */
  tone?: "alarm";
}

export interface UPlotChartProps {
  /** Accessible name of the chart. */
  label: string;
  series: ChartSeries[];
  source: ChartSource;
  /** time: x in s since the epoch; log: x in Hz on a log axis; linear: x as it is. */
  x: { kind: "time" | "log" | "linear"; label: string; unit: string };
  axes: ChartAxis[];
  height: number;
  /** Manual y range of the "y" scale; null or absent means auto. */
  yRange?: [number, number] | null;
  /** Stops pulling data from the source (the chart keeps what it shows). */
  paused?: boolean;
  /** The engineer zoomed in (true) or reset the zoom with a double click (false). */
  onZoom?: (zoomed: boolean) => void;
  /** A shared x range to show (e.g. the magnitude chart's zoom for the phase chart); null shows the whole extent. */
  view?: readonly [number, number] | null;
  /** The engineer zoomed or panned to an x range, or reset it (null). */
  onView?: (range: [number, number] | null) => void;
  /** A click (not a drag) at x. */
  onPick?: (x: number) => void;
  /** The legend toggled series i (0-based, without x). */
  onToggle?: (index: number, show: boolean) => void;
  /** Vertical markers with labels, drawn on every redraw. */
  marks?: ChartMark[];
  testId?: string;
}

const AXIS_STROKE = "#94a3b8";
const GRID = { stroke: "rgba(148, 163, 184, 0.14)", width: 1 };
const TICKS = { stroke: "rgba(148, 163, 184, 0.3)", width: 1 };

const pad = (n: number, width = 2) => String(n).padStart(width, "0");

/** Local clock time of t s since the epoch: hh:mm:ss, with .mmm when asked. */
function clock(t: number, ms: boolean): string {
  const d = new Date(t * 1000);
  const base = `${pad(d.getHours())}:${pad(d.getMinutes())}:${pad(d.getSeconds())}`;
  return ms ? `${base}.${pad(d.getMilliseconds(), 3)}` : base;
}

const formatValue = (unit: string) => (_u: uPlot, v: number | null) => (v == null ? "—" : `${trim(v, 4).replace("-", "−")} ${unit}`.trim());

function seriesOptions(s: ChartSeries): uPlot.Series {
  return {
    label: s.label,
    stroke: s.color,
    width: s.width ?? 1.25,
    dash: s.dash,
    scale: s.scale ?? "y",
    show: s.show ?? true,
    spanGaps: false,
    points: { show: false },
    value: formatValue(s.unit),
  };
}

/**
 * The one uPlot wrapper: the plot is created once on mount and destroyed on unmount; data is pulled
 * from `source` at most once per animation frame (after the source reports a change); series are
 * added, removed and shown in place. Drag zooms x, shift-drag pans, a double click resets; the x axis
 * may be time, linear or log₁₀. The canvas is dark in both themes. Live charts should use 1 px lines:
 * wider strokes of dense min/max traces cost several times the frame time in software rendering.
 */
export function UPlotChart(props: UPlotChartProps) {
  const hostRef = useRef<HTMLDivElement>(null);
  const plotRef = useRef<uPlot | null>(null);
  // The latest props for the chart's callbacks, written before any effect of the commit reads them.
  const propsRef = useRef(props);
  useInsertionEffect(() => {
    propsRef.current = props;
  });
  const zoomedRef = useRef(false);
  /** The live window when the stream was paused: a paused chart keeps showing it while the stream runs on. */
  const frozenRef = useRef<[number, number] | null>(null);
  /** True while the chart applies a `view` prop, so it does not report its own range back. */
  const applyingViewRef = useRef(false);
  const scheduleRef = useRef<() => void>(() => {});
  const seriesKey = props.series.map((s) => `${s.label}|${s.color}|${s.scale ?? "y"}|${s.dash ?? ""}`).join(";");
  const builtKeyRef = useRef(seriesKey);

  useEffect(() => {
    const host = hostRef.current;
    if (!host) return;
    const p = propsRef.current;
    let frame = 0;
    let destroyed = false;

    const xRange = (_u: uPlot, min: number | null, max: number | null): uPlot.Range.MinMax => {
      if (zoomedRef.current && min != null && max != null && max > min) return [min, max];
      const live = propsRef.current.source.xRange?.() ?? null;
      if (live) return propsRef.current.paused ? (frozenRef.current ?? live) : live;
      if (p.x.kind === "log") {
        // A log axis needs a positive range: an empty plot shows one to a thousand.
        if (min == null || max == null || !(min > 0) || !(max > min)) return [1, 1000];
        // The data's own extent, so a frequency axis ends where the response does (just below Nyquist), not at the next decade.
        return [min, max];
      }
      if (min == null || max == null) return [0, 1];
      return min === max ? [min - 1, max + 1] : [min, max];
    };
    const autoRange = (floor: number | undefined) => (_u: uPlot, min: number | null, max: number | null): uPlot.Range.MinMax => {
      if (min == null || max == null) return [-1, 1];
      const lo = floor === undefined ? min : Math.min(Math.max(min, floor), max);
      return uPlot.rangeNum(lo, max, 0.08, true);
    };
    const scales: uPlot.Scales = {
      // Time is drawn on a plain numeric scale with our own clock labels: uPlot's calendar time axis
      // cost about half the frame rate at 1,500 px in headless Chromium (tests/bench/chart.bench.ts).
      x: p.x.kind === "log" ? { time: false, distr: 3, log: 10, range: xRange } : { time: false, range: xRange },
    };
    for (const a of p.axes) {
      const auto = autoRange(a.floor);
      scales[a.scale] ??= { range: a.scale === "y" ? (u, min, max) => propsRef.current.yRange ?? auto(u, min, max) : auto };
    }
    const axis = (a: Partial<uPlot.Axis>): uPlot.Axis => ({ stroke: AXIS_STROKE, grid: GRID, ticks: TICKS, font: "11px var(--font-mono), monospace", labelFont: "11px var(--font-inter), sans-serif", ...a });

    let pointerDown = false;
    /** A shift-drag pan is under way: its range is reported once, when it ends. */
    let panning = false;
    const panPlugin: uPlot.Plugin = {
      hooks: {
        init: (u) => {
          let start: { x: number; min: number; max: number } | null = null;
          const onDown = (e: MouseEvent) => {
            pointerDown = true;
            if (!e.shiftKey || e.button !== 0) return;
            e.stopPropagation();
            start = { x: e.clientX, min: u.scales.x.min ?? 0, max: u.scales.x.max ?? 1 };
            panning = true;
            zoomedRef.current = true;
            propsRef.current.onZoom?.(true);
          };
          const onMove = (e: MouseEvent) => {
            if (!start) return;
            const width = u.over.getBoundingClientRect().width || 1;
            const frac = (e.clientX - start.x) / width;
            if (p.x.kind === "log") {
              const k = Math.pow(start.max / start.min, -frac);
              u.setScale("x", { min: start.min * k, max: start.max * k });
            } else {
              const d = -frac * (start.max - start.min);
              u.setScale("x", { min: start.min + d, max: start.max + d });
            }
          };
          const onUp = () => {
            start = null;
            if (panning) {
              panning = false;
              const { min, max } = u.scales.x;
              if (min != null && max != null) propsRef.current.onView?.([min, max]);
            }
            setTimeout(() => (pointerDown = false), 0);
          };
          const onDbl = () => {
            pointerDown = false;
            zoomedRef.current = false;
            propsRef.current.onZoom?.(false);
            propsRef.current.onView?.(null);
            scheduleRef.current();
          };
          u.over.addEventListener("mousedown", onDown, true);
          window.addEventListener("mousemove", onMove);
          window.addEventListener("mouseup", onUp);
          u.over.addEventListener("dblclick", onDbl);
          u.over.addEventListener("click", (e) => {
            if (u.select.width > 2 || e.shiftKey) return;
            const v = u.posToVal(e.offsetX, "x");
            if (Number.isFinite(v)) propsRef.current.onPick?.(v);
          });
          (u as uPlot & { _cleanupPan?: () => void })._cleanupPan = () => {
            window.removeEventListener("mousemove", onMove);
            window.removeEventListener("mouseup", onUp);
          };
        },
        // A drag-zoom reports its selection just before it sets the x scale: from here on the x range is the engineer's.
        setSelect: (u) => {
          if (pointerDown && u.select.width > 0 && !zoomedRef.current) {
            zoomedRef.current = true;
            propsRef.current.onZoom?.(true);
          }
        },
        setScale: (u, key) => {
          const { min, max } = u.scales.x;
          if (key === "x" && zoomedRef.current && !panning && !applyingViewRef.current && min != null && max != null) propsRef.current.onView?.([min, max]);
        },
        draw: (u) => {
          const marks = propsRef.current.marks;
          if (!marks?.length) return;
          const ctx = u.ctx;
          const dpr = uPlot.pxRatio;
          ctx.save();
          ctx.font = `${11 * dpr}px var(--font-mono), monospace`;
          ctx.textAlign = "center";
          const right = u.bbox.left + u.bbox.width;
          marks.forEach((m, i) => {
            const x = u.valToPos(m.x, "x", true);
            if (m.endX !== undefined) {
              const from = Math.max(u.bbox.left, x);
              const to = Math.min(right, u.valToPos(m.endX, "x", true));
              ctx.fillStyle = m.tone === "alarm" ? "rgba(220, 63, 63, 0.12)" : "rgba(226, 232, 240, 0.08)";
              if (to > from) ctx.fillRect(from, u.bbox.top, to - from, u.bbox.height);
            }
            if (x < u.bbox.left || x > right) return;
            ctx.strokeStyle = m.tone === "alarm" ? "rgba(220, 63, 63, 0.8)" : "rgba(226, 232, 240, 0.35)";
            ctx.setLineDash([3 * dpr, 3 * dpr]);
            ctx.beginPath();
            ctx.moveTo(x, u.bbox.top);
            ctx.lineTo(x, u.bbox.top + u.bbox.height);
            ctx.stroke();
            ctx.fillStyle = m.tone === "alarm" ? "#f87171" : "#e2e8f0";
            ctx.fillText(m.label, x, u.bbox.top + (12 + (i % 2) * 13) * dpr);
          });
          ctx.restore();
        },
        setSeries: (_u, idx, opts) => {
          if (idx != null && idx > 0 && opts.show !== undefined) propsRef.current.onToggle?.(idx - 1, opts.show);
        },
      },
    };

    const opts: uPlot.Options = {
      width: Math.max(200, host.clientWidth),
      height: p.height,
      scales,
      series: [
        { label: p.x.label, value: p.x.kind === "time" ? (_u: uPlot, v: number | null) => (v == null ? "—" : clock(v, true)) : formatValue(p.x.unit) },
        ...p.series.map(seriesOptions),
      ],
      axes: [
        axis({
          label: p.x.label,
          scale: "x",
          space: p.x.kind === "log" ? 40 : p.x.kind === "time" ? 90 : 70,
          // Ticks less than a second apart (a 1 s window, a zoom) get milliseconds, so no two labels read the same.
          values: p.x.kind === "time" ? (_u: uPlot, splits: number[]) => splits.map((v) => clock(v, splits.length > 1 && splits[1] - splits[0] < 1)) : undefined,
        }),
        ...p.axes.map((a) =>
          axis({
            scale: a.scale,
            label: a.label,
            side: a.side === "right" ? 1 : 3,
            grid: a.side === "right" ? { show: false } : GRID,
            size: 56,
            values: a.format ? (_u: uPlot, splits: number[]) => splits.map((v) => a.format!(v)) : undefined,
          }),
        ),
      ],
      cursor: { drag: { x: true, y: false, setScale: true }, points: { size: 5 } },
      legend: { show: true, live: true },
      plugins: [panPlugin],
    };
    const initial = p.source.snapshot(opts.width);
    const plot = new uPlot(opts, initial, host);
    plotRef.current = plot;

    const flush = () => {
      frame = 0;
      if (destroyed || propsRef.current.paused) return;
      plot.setData(propsRef.current.source.snapshot(plot.width), !zoomedRef.current);
    };
    const schedule = () => {
      if (!frame && !destroyed) frame = requestAnimationFrame(flush);
    };
    scheduleRef.current = schedule;
    const resize = new ResizeObserver(() => {
      const width = Math.max(200, host.clientWidth);
      if (width !== plot.width) plot.setSize({ width, height: propsRef.current.height });
    });
    resize.observe(host);

    return () => {
      destroyed = true;
      if (frame) cancelAnimationFrame(frame);
      resize.disconnect();
      (plot as uPlot & { _cleanupPan?: () => void })._cleanupPan?.();
      plot.destroy();
      plotRef.current = null;
    };
  }, []);

  // A new set of series is rebuilt in place; a new source is followed (its changes redraw once per frame).
  useEffect(() => {
    const plot = plotRef.current;
    if (!plot) return;
    if (builtKeyRef.current !== seriesKey) {
      builtKeyRef.current = seriesKey;
      while (plot.series.length > 1) plot.delSeries(plot.series.length - 1);
      propsRef.current.series.forEach((s) => plot.addSeries(seriesOptions(s)));
    }
    scheduleRef.current();
    return propsRef.current.source.subscribe(() => scheduleRef.current());
  }, [seriesKey, props.source]);

  const showKey = props.series.map((s) => (s.show ?? true ? 1 : 0)).join("");
  useEffect(() => {
    const plot = plotRef.current;
    if (!plot) return;
    propsRef.current.series.forEach((s, i) => {
      const show = s.show ?? true;
      if (plot.series[i + 1] && plot.series[i + 1].show !== show) plot.setSeries(i + 1, { show }, false);
    });
  }, [showKey]);

  // A manual y range, a resumed stream or a new height: redraw with the new settings.
  const yKey = props.yRange ? props.yRange.join(",") : "auto";
  useEffect(() => {
    const plot = plotRef.current;
    if (!plot) return;
    if (plot.height !== props.height) plot.setSize({ width: plot.width, height: props.height });
    if (!props.paused) zoomedRef.current = false;
    frozenRef.current = props.paused ? (frozenRef.current ?? propsRef.current.source.xRange?.() ?? null) : null;
    const yRange = propsRef.current.yRange;
    if (yRange) plot.setScale("y", { min: yRange[0], max: yRange[1] });
    else if (!zoomedRef.current) plot.setData(plot.data, true);
    scheduleRef.current();
  }, [yKey, props.paused, props.height]);

  // A shared view: zoom to it (keeping it when the data changes), or back to the whole extent.
  const viewKey = props.view ? props.view.join(",") : "";
  useEffect(() => {
    const plot = plotRef.current;
    const view = propsRef.current.view;
    if (!plot) return;
    applyingViewRef.current = true;
    zoomedRef.current = view != null;
    if (view) plot.setScale("x", { min: view[0], max: view[1] });
    else plot.setData(plot.data, true);
    applyingViewRef.current = false;
  }, [viewKey]);

  return <div ref={hostRef} role="img" aria-label={props.label} data-testid={props.testId} className="tw-chart w-full min-w-0 overflow-hidden" />;
}
