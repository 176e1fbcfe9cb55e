import type { Complex } from "@/lib/dsp";
import type { LocusData } from "./analysis";

const SIZE = 300;
const PAD = 24;

export type LocusView = "circle" | "near-one";

/** The plotted window in the z-plane: the whole unit circle, or the neighbourhood of z = 1 where slow poles sit. */
const WINDOWS: Record<LocusView, { cx: number; cy: number; half: number }> = {
  circle: { cx: 0, cy: 0, half: 1.3 },
  "near-one": { cx: 0.9, cy: 0, half: 0.15 },
};

/**
 * Root locus of 1 + k·L(z) in the z-plane as SVG: dots for k from 0.01 to 100 times the loop gain, × the
 * open-loop poles (k = 0), ○ the zeros, filled diamonds the closed-loop poles at the current gain (k = 1),
 * and the unit circle (stability boundary).
 */
export function RootLocus({ data, color, title, view, testId }: { data: LocusData; color: string; title: string; view: LocusView; testId: string }) {
  const w = WINDOWS[view];
  const scale = (SIZE / 2 - PAD) / w.half;
  const px = (re: number) => Math.round((SIZE / 2 + (re - w.cx) * scale) * 100) / 100;
  const py = (im: number) => Math.round((SIZE / 2 - (im - w.cy) * scale) * 100) / 100;
  const inside = (p: Complex) => Math.abs(p[0] - w.cx) <= w.half * 1.08 && Math.abs(p[1] - w.cy) <= w.half * 1.08;
  const m = 4.5;
  const unstable = data.current.some((p) => Math.hypot(p[0], p[1]) >= 1);
  return (
    <figure className="m-0">
      <figcaption className="mb-1 text-xs font-medium text-slate-600 dark:text-slate-300">{title}</figcaption>
      <svg viewBox={`0 0 ${SIZE} ${SIZE}`} role="img" aria-label={`${title}: root locus in the z-plane`} data-testid={testId} className="w-full max-w-[22rem] rounded-md bg-canvas">
        <defs>
          <clipPath id={`${testId}-clip`}>
            <rect x={PAD / 2} y={PAD / 2} width={SIZE - PAD} height={SIZE - PAD} />
          </clipPath>
        </defs>
        <g clipPath={`url(#${testId}-clip)`}>
          <line x1={0} x2={SIZE} y1={py(0)} y2={py(0)} stroke="#475569" strokeWidth={1} />
          <line x1={px(0)} x2={px(0)} y1={0} y2={SIZE} stroke="#475569" strokeWidth={1} />
          <circle cx={px(0)} cy={py(0)} r={scale} fill="none" stroke="#94a3b8" strokeDasharray="4 3" />
          {data.branches.slice(1).flatMap((poles, i) =>
            poles.filter(inside).map((p, j) => <circle key={`b${i}-${j}`} cx={px(p[0])} cy={py(p[1])} r={1.3} fill={color} opacity={0.55} />),
          )}
          {data.zeros.filter(inside).map((z, i) => (
            <circle key={`z${i}`} cx={px(z[0])} cy={py(z[1])} r={m} fill="none" stroke="#e2e8f0" strokeWidth={1.4} />
          ))}
          {data.openLoopPoles.filter(inside).map((p, i) => (
            <path key={`p${i}`} d={`M${px(p[0]) - m},${py(p[1]) - m}L${px(p[0]) + m},${py(p[1]) + m}M${px(p[0]) - m},${py(p[1]) + m}L${px(p[0]) + m},${py(p[1]) - m}`} stroke="#e2e8f0" strokeWidth={1.4} />
          ))}
          {data.current.filter(inside).map((p, i) => (
            <path key={`c${i}`} d={`M${px(p[0])},${py(p[1]) - 5}L${px(p[0]) + 5},${py(p[1])}L${px(p[0])},${py(p[1]) + 5}L${px(p[0]) - 5},${py(p[1])}Z`} fill={unstable ? "#ef4444" : color} stroke="#0f172a" strokeWidth={0.8} />
          ))}
        </g>
        <text x={SIZE - 6} y={py(0) - 5} textAnchor="end" fontSize={10} fill="#94a3b8">
          Re z
        </text>
        <text x={SIZE - 6} y={SIZE - 6} textAnchor="end" fontSize={10} fill="#64748b" className="num">
          {view === "circle" ? "±1.3" : `${(w.cx - w.half).toFixed(2)} … ${(w.cx + w.half).toFixed(2)}`}
        </text>
      </svg>
    </figure>
  );
}
