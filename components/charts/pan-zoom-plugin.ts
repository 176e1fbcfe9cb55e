import type uPlot from "uplot";
import type { ChartRefs } from "./chart-types";

/**
 * Drag zooms x (uPlot's own selection), shift-drag pans, a double click goes back to the whole extent.
 * Zooms and pans are reported through `onZoom` and `onView` (a pan once, when it ends); a range the chart
 * applies from its `view` prop is not reported back.
 */
export function panZoomPlugin(refs: ChartRefs, log: boolean): uPlot.Plugin {
  let pointerDown = false;
  /** A shift-drag pan is under way: its range is reported once, when it ends. */
  let panning = false;
  let detach = () => {};

  const init = (u: uPlot) => {
    let start: { x: number; min: number; max: number } | null = null;
    const onDown = (e: MouseEvent) => {
      pointerDown = true;
      if (!e.shiftKey || e.button !== 0) return;
      e.stopPropagation();
      start = { x: e.clientX, min: u.scales.x.min ?? 0, max: u.scales.x.max ?? 1 };
      panning = true;
      refs.zoomed.current = true;
      refs.props.current.onZoom?.(true);
    };
    const onMove = (e: MouseEvent) => {
      if (!start) return;
      const width = u.over.getBoundingClientRect().width || 1;
      const frac = (e.clientX - start.x) / width;
      if (log) {
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
        if (min != null && max != null) refs.props.current.onView?.([min, max]);
      }
      setTimeout(() => (pointerDown = false), 0);
    };
    const onDbl = () => {
      pointerDown = false;
      refs.zoomed.current = false;
      refs.props.current.onZoom?.(false);
      refs.props.current.onView?.(null);
      refs.schedule.current();
    };
    u.over.addEventListener("mousedown", onDown, true);
    window.addEventListener("mousemove", onMove);
    window.addEventListener("mouseup", onUp);
    u.over.addEventListener("dblclick", onDbl);
    detach = () => {
      window.removeEventListener("mousemove", onMove);
      window.removeEventListener("mouseup", onUp);
    };
  };

  return {
    hooks: {
      init,
      // A drag-zoom reports its selection just before it sets the x scale: from here on the x range is the engineer's.
      setSelect: (u) => {
        if (pointerDown && u.select.width > 0 && !refs.zoomed.current) {
          refs.zoomed.current = true;
          refs.props.current.onZoom?.(true);
        }
      },
      setScale: (u, key) => {
        const { min, max } = u.scales.x;
        if (key === "x" && refs.zoomed.current && !panning && !refs.applyingView.current && min != null && max != null) refs.props.current.onView?.([min, max]);
      },
      destroy: () => detach(),
    },
  };
}
