import uPlot from "uplot";
import { nearestIndex, placeCursor, snapToData, type Cursors } from "@/lib/charts/cursors";
import type { ChartRefs } from "./chart-types";

/** What the cursor plugin reads and reports, through refs so the plot is never rebuilt for it. */
export interface CursorLink {
  cursors: { readonly current: Cursors };
  /** The chart's cursors are on: a click places one instead of picking. */
  armed: { readonly current: boolean };
  /** New cursors from a click, or the ones before a double click (which resets the zoom, and places nothing). */
  set: (c: Cursors) => void;
  /** After every redraw (the readout follows the data under the cursors). */
  drawn: (u: uPlot) => void;
}

/** A press that moved further than this (px) is a drag, not a click. */
const CLICK_SLOP_PX = 3;

/**
 * The two measurement cursors: drawn as labelled lines with a dot on each shown series; a click places one
 * while the chart's cursors are on, and otherwise goes to `onPick`.
 */
export function cursorPlugin(refs: ChartRefs, link: CursorLink, log: boolean): uPlot.Plugin {
  const init = (u: uPlot) => {
    let down: { x: number; y: number } | null = null;
    /** The cursors before the last click placed one, so the double click that follows can put them back. */
    let before: Cursors | null = null;
    u.over.addEventListener("mousedown", (e) => (down = { x: e.clientX, y: e.clientY }));
    u.over.addEventListener("click", (e) => {
      const dragged = down !== null && Math.hypot(e.clientX - down.x, e.clientY - down.y) > CLICK_SLOP_PX;
      down = null;
      // The second click of a double click is not a new placement.
      if (dragged || u.select.width > 2 || e.shiftKey || e.detail > 1) return;
      const v = u.posToVal(e.clientX - u.over.getBoundingClientRect().left, "x");
      if (!Number.isFinite(v)) return;
      if (!link.armed.current) {
        refs.props.current.onPick?.(v);
        return;
      }
      const snapped = snapToData(u.data[0], v, log);
      if (snapped === null) return;
      before = link.cursors.current;
      link.set(placeCursor(before, snapped, log));
    });
    u.over.addEventListener("dblclick", () => {
      if (before) link.set(before);
      before = null;
    });
  };

  const draw = (u: uPlot) => {
    const { a, b, active } = link.cursors.current;
    const dpr = uPlot.pxRatio;
    const ctx = u.ctx;
    const right = u.bbox.left + u.bbox.width;
    ctx.save();
    ctx.font = `600 ${11 * dpr}px sans-serif`;
    ctx.textAlign = "center";
    ctx.textBaseline = "middle";
    for (const [name, x] of [["A", a], ["B", b]] as const) {
      if (x === null) continue;
      const px = u.valToPos(x, "x", true);
      if (px < u.bbox.left - 1 || px > right + 1) continue;
      const isActive = active === name.toLowerCase();
      ctx.strokeStyle = isActive ? "rgba(248, 250, 252, 0.95)" : "rgba(248, 250, 252, 0.6)";
      ctx.lineWidth = (isActive ? 1.5 : 1) * dpr;
      ctx.setLineDash(name === "A" ? [] : [5 * dpr, 3 * dpr]);
      ctx.beginPath();
      ctx.moveTo(px, u.bbox.top);
      ctx.lineTo(px, u.bbox.top + u.bbox.height);
      ctx.stroke();
      // A dot where the cursor crosses each shown series.
      const i = nearestIndex(u.data[0], x, log);
      if (i !== null) {
        u.series.forEach((s, k) => {
          const y = k > 0 && s.show ? u.data[k][i] : null;
          if (y == null || !Number.isFinite(y)) return;
          const py = u.valToPos(y, s.scale ?? "y", true);
          ctx.fillStyle = refs.props.current.series[k - 1]?.color ?? "#f8fafc";
          ctx.beginPath();
          ctx.arc(px, py, 3 * dpr, 0, 2 * Math.PI);
          ctx.fill();
        });
      }
      // The name in a small tag at the top of the line.
      const w = 14 * dpr;
      ctx.fillStyle = isActive ? "#f8fafc" : "#94a3b8";
      ctx.fillRect(px - w / 2, u.bbox.top, w, w);
      ctx.fillStyle = "#0d1420";
      ctx.fillText(name, px, u.bbox.top + w / 2 + 0.5 * dpr);
    }
    ctx.restore();
    link.drawn(u);
  };

  return { hooks: { init, draw } };
}
