"use client";

import { useEffect, useMemo } from "react";
import { CANDIDATE_COLORS, PRODUCTION_COLOR, RAW_COLOR } from "@/lib/bench/colors";
import { FIRST_CANDIDATE_SLOT, LiveStore, PRODUCTION_SLOT, PRODUCTION_TRACE, RAW_SLOT } from "@/lib/bench/live-store";
import { LivePanel, type TraceInfo } from "./live-panel";
import type { LiveStatus } from "./use-live-channel";
import { useClock } from "@/components/hooks/use-clock";

/** Frames per second of the synthetic feed: the sidecar's frame interval (33 ms). */
const FEED_FPS = 30;
const CANDIDATES = 4;

/**
 * The live panel fed with generated frames at the live rate, no sidecar needed: raw (a 50 Hz tone, a
 * 240 Hz tone and deterministic noise), production and four candidates, for the chart speed bench.
 */
export function SyntheticBench({ sampleRateHz }: { sampleRateHz: number }) {
  const now = useClock(1000);
  const store = useMemo(() => new LiveStore(sampleRateHz), [sampleRateHz]);
  const ids = useMemo(() => Array.from({ length: CANDIDATES }, (_, i) => `synthetic-${i}`), []);
  useEffect(() => {
    ids.forEach((id, i) => store.bind(id, FIRST_CANDIDATE_SLOT + i));
    let n = 0;
    let seed = 12345;
    const noise = () => ((seed = (seed * 1103515245 + 12345) >>> 0) / 2 ** 32 - 0.5) * 2;
    const start = Date.now();
    const timer = setInterval(() => {
      const due = Math.floor(((Date.now() - start) / 1000) * sampleRateHz) - n;
      if (due <= 0) return;
      const raw: number[] = [];
      for (let k = 0; k < due; k++) {
        const t = (n + k) / sampleRateHz;
        raw.push(100 + 20 * Math.sin(2 * Math.PI * 50 * t) + 8 * Math.sin(2 * Math.PI * 240 * t) + 5 * noise());
      }
      const smooth = (alpha: number) => {
        let y = raw[0];
        return raw.map((x) => (y += alpha * (x - y)));
      };
      const traces: Record<string, number[]> = { [PRODUCTION_TRACE]: smooth(0.3) };
      ids.forEach((id, i) => (traces[id] = smooth(0.05 + 0.15 * i)));
      store.push({ type: "frame", channel: "synthetic/bench/feed", seq: n, t0: start + (n * 1000) / sampleRateHz, sampleRateHz, raw, traces, samples: due, decimated: false });
      n += due;
    }, 1000 / FEED_FPS);
    return () => clearInterval(timer);
  }, [store, ids, sampleRateHz]);

  const traces: TraceInfo[] = [
    { id: "raw", slot: RAW_SLOT, label: "Raw", color: RAW_COLOR, visible: true },
    { id: PRODUCTION_TRACE, slot: PRODUCTION_SLOT, label: "Production", color: PRODUCTION_COLOR, visible: true },
    ...ids.map((id, i) => ({ id, slot: FIRST_CANDIDATE_SLOT + i, label: `Candidate ${String.fromCharCode(65 + i)}`, color: CANDIDATE_COLORS[i], visible: true })),
  ];
  const status: LiveStatus = { link: "live", retryAt: null, mqtt: "connected", droppedFrames: 0, lastFrameAt: now, error: null };
  return <LivePanel store={store} status={status} traces={traces} unit="V" onToggle={() => {}} />;
}
