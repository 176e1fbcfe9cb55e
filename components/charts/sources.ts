import type uPlot from "uplot";
import { decimateMinMax } from "@/lib/bench/decimate";
import type { LiveStore } from "@/lib/bench/live-store";

/** Where a chart gets its data: it hears of changes and pulls a snapshot sized for its width in px. */
export interface ChartSource {
  subscribe(onChange: () => void): () => void;
  snapshot(widthPx: number): uPlot.AlignedData;
  /** A live window the x axis should follow, or null for the data's own extent. */
  xRange?(): [number, number] | null;
}

/** Data that is already computed (analysis curves): one snapshot, no changes. */
export function staticSource(data: uPlot.AlignedData): ChartSource {
  return { subscribe: () => () => {}, snapshot: () => data };
}

/**
 * The last `windowSeconds.current` s of a live store, min/max-decimated to about 2 points per pixel, with the
 * columns of `slots.current` in order (both refs, read at each snapshot). Changes come from the store; the chart redraws once per frame.
 */
export function liveSource(store: LiveStore, slots: { readonly current: readonly number[] }, windowSeconds: { readonly current: number }): ChartSource {
  return {
    subscribe: (onChange) => store.subscribe(onChange),
    snapshot(widthPx) {
      const ring = store.ring;
      const from = ring.lowerBound(ring.lastX() - windowSeconds.current);
      const [x, ...ys] = decimateMinMax(ring, from, ring.length, Math.max(1, Math.round(widthPx)));
      return [x, ...slots.current.map((s) => ys[s])] as uPlot.AlignedData;
    },
    xRange() {
      const last = store.ring.lastX();
      return Number.isNaN(last) ? null : [last - windowSeconds.current, last];
    },
  };
}
