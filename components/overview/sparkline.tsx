import { trim } from "@/lib/format/units";
import { envelopePoints } from "./format";
import type { LiveSpark } from "@/lib/protocol";

const W = 120;
const H = 28;

/** The channel's recent raw envelope (min/max per bucket) as a small inline SVG; no chart library. */
export function Sparkline({ spark, unit }: { spark: LiveSpark; unit: string }) {
  const seconds = (spark.min.length * spark.stepMs) / 1000;
  const lo = Math.min(...spark.min);
  const hi = Math.max(...spark.max);
  return (
    <svg
      data-testid="sparkline"
      role="img"
      aria-label={`Last ${trim(seconds, 2)} s: ${trim(lo)} to ${trim(hi)} ${unit}`}
      viewBox={`-1 -1 ${W + 2} ${H + 2}`}
      width={W}
      height={H}
      className="shrink-0 overflow-visible rounded-sm bg-canvas"
    >
      <polygon points={envelopePoints(spark.min, spark.max, W, H)} className="fill-slate-400/60 stroke-slate-300" strokeWidth={0.75} strokeLinejoin="round" />
    </svg>
  );
}
