import type { Complex } from "@/lib/dsp";
import { withUnit } from "@/lib/bench/format";

export interface RootSet {
  name: string;
  color: string;
  zeros: Complex[];
  poles: Complex[];
}

/** Roots that coincide (to 1e-6 of the plot extent) drawn once, with how many there are. */
function grouped(roots: Complex[], extent: number): { root: Complex; count: number }[] {
  const out: { root: Complex; count: number }[] = [];
  for (const r of roots) {
    const same = out.find((g) => Math.hypot(g.root[0] - r[0], g.root[1] - r[1]) < 1e-6 * extent);
    if (same) same.count++;
    else out.push({ root: r, count: 1 });
  }
  return out;
}

const SIZE = 300;
const PAD = 28;

/**
 * A pole-zero map as SVG: × for poles, ○ for zeros, one colour per filter. The z-plane shows the unit
 * circle and spans at least ±1.25; the s-plane (rad/s) fits its roots and marks the imaginary axis.
 */
export function PoleZeroMap({ sets, plane, label, testId = `pz-${plane}` }: { sets: RootSet[]; plane: "z" | "s"; label: string; testId?: string }) {
  const all = sets.flatMap((s) => [...s.zeros, ...s.poles]).filter((r) => Number.isFinite(r[0]) && Number.isFinite(r[1]));
  const extent = Math.max(plane === "z" ? 1.25 : 1e-9, ...all.map((r) => Math.max(Math.abs(r[0]), Math.abs(r[1])) * 1.15));
  const scale = (SIZE / 2 - PAD) / extent;
  const px = (re: number) => SIZE / 2 + re * scale;
  const py = (im: number) => SIZE / 2 - im * scale;
  const m = 4.5;
  return (
    <figure className="m-0">
      <svg viewBox={`0 0 ${SIZE} ${SIZE}`} role="img" aria-label={label} data-testid={testId} className="w-full max-w-[22rem] rounded-md bg-canvas">
        <line x1={PAD / 2} x2={SIZE - PAD / 2} y1={SIZE / 2} y2={SIZE / 2} stroke="#475569" strokeWidth={1} />
        <line x1={SIZE / 2} x2={SIZE / 2} y1={PAD / 2} y2={SIZE - PAD / 2} stroke={plane === "s" ? "#94a3b8" : "#475569"} strokeWidth={plane === "s" ? 1.5 : 1} />
        {plane === "z" && <circle cx={SIZE / 2} cy={SIZE / 2} r={scale} fill="none" stroke="#94a3b8" strokeDasharray="4 3" />}
        <text x={SIZE - PAD / 2} y={SIZE / 2 - 5} textAnchor="end" fontSize={10} fill="#94a3b8">
          {plane === "z" ? "Re z" : "σ (1/s)"}
        </text>
        <text x={SIZE / 2 + 5} y={PAD / 2 + 8} fontSize={10} fill="#94a3b8">
          {plane === "z" ? "Im z" : "jω (rad/s)"}
        </text>
        <text x={SIZE - 4} y={SIZE - 6} textAnchor="end" fontSize={10} fill="#64748b" className="num">
          ±{withUnit(extent, "", 3)}
        </text>
        {sets.map((s) => (
          <g key={s.name} stroke={s.color} fill="none" strokeWidth={1.6}>
            {grouped(s.zeros, extent).map(({ root: z, count }, i) => (
              <g key={`z${i}`}>
                <circle cx={px(z[0])} cy={py(z[1])} r={m} />
                {count > 1 && <Multiplicity x={px(z[0])} y={py(z[1])} count={count} color={s.color} />}
              </g>
            ))}
            {grouped(s.poles, extent).map(({ root: p, count }, i) => (
              <g key={`p${i}`}>
                <path d={`M${px(p[0]) - m},${py(p[1]) - m}L${px(p[0]) + m},${py(p[1]) + m}M${px(p[0]) - m},${py(p[1]) + m}L${px(p[0]) + m},${py(p[1]) - m}`} />
                {count > 1 && <Multiplicity x={px(p[0])} y={py(p[1])} count={count} color={s.color} />}
              </g>
            ))}
          </g>
        ))}
      </svg>
      <figcaption className="mt-1 text-xs text-slate-500">
        {plane === "z" ? "z-plane: × poles, ○ zeros (a number counts repeated ones), dashed unit circle" : "s-plane of the analog prototype: × poles, ○ zeros"}
      </figcaption>
    </figure>
  );
}

function Multiplicity({ x, y, count, color }: { x: number; y: number; count: number; color: string }) {
  return (
    <text x={x + 6} y={y - 6} fontSize={10} fill={color} stroke="none">
      {count}
    </text>
  );
}
