import uPlot from "uplot";
import type { ChartRefs } from "./chart-types";

/** Draws the chart's `marks` (labelled dashed lines, shaded spans) over the plot on every redraw. */
export function marksPlugin(refs: ChartRefs): uPlot.Plugin {
  const draw = (u: uPlot) => {
    const marks = refs.props.current.marks;
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
  };
  return { hooks: { draw } };
}
