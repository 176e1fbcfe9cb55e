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

/** The x axis: time is x in s since the epoch; log is x in Hz on a log axis; linear is x as it is. */
export interface ChartX {
  kind: "time" | "log" | "linear";
  label: string;
  unit: string;
}

/**
 * Props of the one uPlot wrapper. Every prop is followed while the chart lives except `x` and `axes`, which
 * shape the plot and are read once when it is created: to change them, give the chart a new React `key`.
 */
export interface UPlotChartProps {
  /** Accessible name of the chart; also names its downloads. */
  label: string;
  series: ChartSeries[];
  source: ChartSource;
  /** Fixed for the chart's life (read once at creation). The cursors word Δt, Δf or Δx from its kind and unit. */
  x: ChartX;
  /** Fixed for the chart's life (read once at creation), except `format`, which is called as given last. */
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
  /** A click (not a drag) at x, while the chart's cursors are off. */
  onPick?: (x: number) => void;
  /** The legend toggled series i (0-based, without x). */
  onToggle?: (index: number, show: boolean) => void;
  /** Vertical markers with labels, drawn on every redraw. */
  marks?: ChartMark[];
  testId?: string;
}

/** The chart's mutable state, shared by the options builder and the plugins (all read at call time). */
export interface ChartRefs {
  /** The latest props, written before any effect of a commit reads them. */
  props: { readonly current: UPlotChartProps };
  /** The x range is the engineer's (a zoom, a pan or a shared view) instead of following the data. */
  zoomed: { current: boolean };
  /** The live window when the stream was paused: a paused chart keeps showing it while the stream runs on. */
  frozen: { current: [number, number] | null };
  /** True while the chart applies a `view` prop, so it does not report its own range back. */
  applyingView: { current: boolean };
  /** Asks for one redraw from the source on the next animation frame. */
  schedule: { current: () => void };
}
