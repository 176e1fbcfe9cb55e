import uPlot from "uplot";
import type { ChartSeries } from "./chart-types";

/** The chart canvas colour (tailwind `canvas`), so an exported picture looks as the chart does on screen. */
const CANVAS = "#0d1420";

/** Saves a blob under `name` through a temporary link. */
export function downloadBlob(blob: Blob, name: string): void {
  const url = URL.createObjectURL(blob);
  const link = document.createElement("a");
  link.href = url;
  link.download = name;
  link.click();
  // The click has started the download; the URL is released once the browser has read it.
  setTimeout(() => URL.revokeObjectURL(url), 10_000);
}

/**
 * The plot as a PNG: the chart's own canvas (traces, axes, marks, cursors) on the dark chart colour, under a
 * band with the title and a swatch and name for each shown series.
 */
export function chartPng(u: uPlot, title: string, series: readonly ChartSeries[]): Promise<Blob> {
  const source = u.ctx.canvas;
  const dpr = uPlot.pxRatio;
  const band = 46 * dpr;
  const out = document.createElement("canvas");
  out.width = source.width;
  out.height = source.height + band;
  const ctx = out.getContext("2d");
  if (!ctx) return Promise.reject(new Error("the browser gave no 2D canvas for the picture"));
  const family = getComputedStyle(document.body).fontFamily || "sans-serif";
  ctx.fillStyle = CANVAS;
  ctx.fillRect(0, 0, out.width, out.height);
  ctx.textBaseline = "middle";
  ctx.fillStyle = "#e2e8f0";
  ctx.font = `600 ${13 * dpr}px ${family}`;
  ctx.fillText(title, 10 * dpr, 14 * dpr);
  ctx.font = `${11 * dpr}px ${family}`;
  let x = 10 * dpr;
  series.forEach((s, i) => {
    if (!u.series[i + 1]?.show) return;
    const label = s.label;
    ctx.fillStyle = s.color;
    ctx.fillRect(x, 31 * dpr, 10 * dpr, 4 * dpr);
    ctx.fillStyle = "#cbd5e1";
    ctx.fillText(label, x + 14 * dpr, 33 * dpr);
    x += 14 * dpr + ctx.measureText(label).width + 14 * dpr;
  });
  ctx.drawImage(source, 0, band);
  return new Promise((resolve, reject) => out.toBlob((blob) => (blob ? resolve(blob) : reject(new Error("the browser could not encode the picture"))), "image/png"));
}
