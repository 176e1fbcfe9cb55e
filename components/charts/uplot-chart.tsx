"use client";

import { useEffect, useId, useInsertionEffect, useRef, useState, type KeyboardEvent } from "react";
import uPlot from "uplot";
import "uplot/dist/uPlot.min.css";
import "./chart.css";
import { chartCsv } from "@/lib/charts/csv";
import { NO_CURSORS, cursorReadout, cursorsAfterKey, type CursorReadout, type Cursors } from "@/lib/charts/cursors";
import { chartFileName } from "@/lib/charts/file-name";
import { chartPng, downloadBlob } from "./chart-export";
import { buildOptions, seriesOptions } from "./chart-options";
import type { ChartRefs, UPlotChartProps } from "./chart-types";
import { cursorPlugin } from "./cursor-plugin";
import { CursorReadoutView } from "./cursor-readout";
import { marksPlugin } from "./marks-plugin";
import { panZoomPlugin } from "./pan-zoom-plugin";

export type { ChartAxis, ChartMark, ChartSeries, UPlotChartProps } from "./chart-types";

/** The cursor readout follows moving data (a live chart) at most this often (ms); a cursor move shows at once. */
const READOUT_EVERY_MS = 250;

/**
 * The one uPlot wrapper: the plot is created once on mount and destroyed on unmount; data is pulled
 * from `source` at most once per animation frame (after the source reports a change); series are
 * added, removed and shown in place. Drag zooms x, shift-drag pans, a double click resets; the x axis
 * may be time, linear or log₁₀. Two measurement cursors (A and B) read every series and the differences;
 * the toolbar turns click-to-place on and downloads the data (CSV) or the picture (PNG); the plot takes
 * keyboard focus, where Enter places a cursor, the arrows move it and Escape clears. The canvas is dark in
 * both themes. Live charts should use 1 px lines: wider strokes of dense min/max traces cost several times
 * the frame time in software rendering.
 */
export function UPlotChart(props: UPlotChartProps) {
  const hostRef = useRef<HTMLDivElement>(null);
  const plotRef = useRef<uPlot | null>(null);
  const [cursors, setCursors] = useState<Cursors>(NO_CURSORS);
  const [armed, setArmed] = useState(false);
  const [readout, setReadout] = useState<CursorReadout | null>(null);
  const [exportError, setExportError] = useState<string | null>(null);
  // The latest props and cursor state for the chart's callbacks, written before any effect of the commit reads them.
  const propsRef = useRef(props);
  const cursorsRef = useRef(cursors);
  const armedRef = useRef(armed);
  useInsertionEffect(() => {
    propsRef.current = props;
    cursorsRef.current = cursors;
    armedRef.current = armed;
  });
  const refsRef = useRef<ChartRefs>({ props: propsRef, zoomed: { current: false }, frozen: { current: null }, applyingView: { current: false }, schedule: { current: () => {} } });
  const seriesKey = props.series.map((s) => `${s.label}|${s.color}|${s.scale ?? "y"}|${s.dash ?? ""}`).join(";");
  const builtKeyRef = useRef(seriesKey);
  const log = props.x.kind === "log";
  const hintId = useId();

  useEffect(() => {
    const host = hostRef.current;
    if (!host) return;
    const refs = refsRef.current;
    const p = propsRef.current;
    const isLog = p.x.kind === "log";
    let frame = 0;
    let destroyed = false;
    let shown = { key: "", cursors: NO_CURSORS, at: 0 };
    /** A readout held back by the rate limit, shown when the limit allows (so the last data is never missed). */
    let trailing = 0;
    const readOut = (u: uPlot) => {
      const c = cursorsRef.current;
      const next = c.a === null && c.b === null ? null : cursorReadout(u.data, c, isLog);
      const key = JSON.stringify(next);
      if (key === shown.key) return;
      const wait = c === shown.cursors ? READOUT_EVERY_MS - (performance.now() - shown.at) : 0;
      if (wait > 0) {
        trailing ||= window.setTimeout(() => {
          trailing = 0;
          if (!destroyed) readOut(u);
        }, wait);
        return;
      }
      shown = { key, cursors: c, at: performance.now() };
      setReadout(next);
    };
    const cursors = cursorPlugin(refs, { cursors: cursorsRef, armed: armedRef, set: setCursors, drawn: readOut }, isLog);
    const opts = buildOptions(p, Math.max(200, host.clientWidth), refs, [panZoomPlugin(refs, isLog), marksPlugin(refs), cursors]);
    const plot = new uPlot(opts, p.source.snapshot(opts.width), host);
    plotRef.current = plot;

    const flush = () => {
      frame = 0;
      if (destroyed || propsRef.current.paused) return;
      plot.setData(propsRef.current.source.snapshot(plot.width), !refs.zoomed.current);
    };
    refs.schedule.current = () => {
      if (!frame && !destroyed) frame = requestAnimationFrame(flush);
    };
    const resize = new ResizeObserver(() => {
      const width = Math.max(200, host.clientWidth);
      if (width !== plot.width) plot.setSize({ width, height: propsRef.current.height });
    });
    resize.observe(host);

    return () => {
      destroyed = true;
      if (frame) cancelAnimationFrame(frame);
      clearTimeout(trailing);
      resize.disconnect();
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
    const schedule = refsRef.current.schedule;
    schedule.current();
    return propsRef.current.source.subscribe(() => schedule.current());
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
    const refs = refsRef.current;
    if (plot.height !== props.height) plot.setSize({ width: plot.width, height: props.height });
    if (!props.paused) refs.zoomed.current = false;
    refs.frozen.current = props.paused ? (refs.frozen.current ?? propsRef.current.source.xRange?.() ?? null) : null;
    const yRange = propsRef.current.yRange;
    if (yRange) plot.setScale("y", { min: yRange[0], max: yRange[1] });
    else if (!refs.zoomed.current) plot.setData(plot.data, true);
    refs.schedule.current();
  }, [yKey, props.paused, props.height]);

  // A shared view: zoom to it (keeping it when the data changes), or back to the whole extent.
  const viewKey = props.view ? props.view.join(",") : "";
  useEffect(() => {
    const plot = plotRef.current;
    const view = propsRef.current.view;
    if (!plot) return;
    const refs = refsRef.current;
    refs.applyingView.current = true;
    refs.zoomed.current = view != null;
    if (view) plot.setScale("x", { min: view[0], max: view[1] });
    else plot.setData(plot.data, true);
    refs.applyingView.current = false;
  }, [viewKey]);

  // Moved cursors or new marks are drawn at once, without waiting for new data.
  const marksKey = JSON.stringify(props.marks ?? []);
  useEffect(() => {
    plotRef.current?.redraw(false);
  }, [cursors, marksKey]);

  const onKeyDown = (e: KeyboardEvent<HTMLDivElement>) => {
    const plot = plotRef.current;
    if (!plot || e.target !== e.currentTarget) return;
    const { min, max } = plot.scales.x;
    const centre = min == null || max == null ? NaN : log ? Math.sqrt(min * max) : (min + max) / 2;
    const next = cursorsAfterKey(cursors, e.key, e.shiftKey, plot.data[0], centre, log);
    if (!next) return;
    // Handled here: the page does not also act on it (an Escape that clears cursors leaves an open editor open).
    e.preventDefault();
    e.stopPropagation();
    setCursors(next);
  };

  const exportAs = async (kind: "csv" | "png") => {
    const plot = plotRef.current;
    if (!plot) return;
    const p = propsRef.current;
    const name = chartFileName(p.label, kind, new Date());
    try {
      if (kind === "png") downloadBlob(await chartPng(plot, p.label, p.series), name);
      else {
        const x = p.x.kind === "time" ? { label: "Time", unit: "s since 1970-01-01 UTC" } : p.x;
        downloadBlob(new Blob([chartCsv(x, p.series, plot.data)], { type: "text/csv;charset=utf-8" }), name);
      }
      setExportError(null);
    } catch (err) {
      console.error("chart export failed", err);
      setExportError(`The ${kind.toUpperCase()} could not be made in this browser; try again or use another browser.`);
    }
  };

  const { label, testId } = props;
  return (
    <div className="min-w-0" data-testid={testId ? `${testId}-frame` : undefined}>
      <div className="tw-chart-toolbar" role="group" aria-label={`${label}: tools`}>
        {armed && <span className="mr-auto">Click places cursor A, then B; the nearer one moves after that. Drag still zooms.</span>}
        <button type="button" className="tw-chart-button" aria-pressed={armed} onClick={() => setArmed((v) => !v)} title="Click the plot to place measurement cursors A and B">
          Cursors
        </button>
        <button type="button" className="tw-chart-button" onClick={() => void exportAs("csv")} aria-label={`Download the data of ${label} as CSV`}>
          CSV
        </button>
        <button type="button" className="tw-chart-button" onClick={() => void exportAs("png")} aria-label={`Download ${label} as a PNG picture`}>
          PNG
        </button>
      </div>
      <div
        ref={hostRef}
        role="group"
        aria-roledescription="chart"
        aria-label={label}
        aria-describedby={hintId}
        tabIndex={0}
        onKeyDown={onKeyDown}
        data-testid={testId}
        data-armed={armed || undefined}
        className="tw-chart w-full min-w-0 overflow-hidden"
      />
      <p id={hintId} className="sr-only">
        Enter or space places measurement cursor A, again for B, again to switch between them; the left and right arrows move the active cursor one point (ten with shift); Escape clears the cursors.
      </p>
      {exportError && (
        <p role="alert" className="mt-1 text-xs text-red-400">
          {exportError}
        </p>
      )}
      <CursorReadoutView cursors={cursors} readout={readout} series={props.series} x={props.x} onClear={() => setCursors(NO_CURSORS)} />
    </div>
  );
}
