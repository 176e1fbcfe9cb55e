import { formatHz } from "@/lib/format/units";

export interface Series {
  label: string;
  /** Okabe–Ito colour of the trace. */
  color: string;
  dashed?: boolean;
  db: number[];
}

interface Props {
  freqsHz: number[];
  series: Series[];
  title: string;
}

const W = 640;
const H = 260;
const PAD = { left: 44, right: 12, top: 12, bottom: 28 };

/**
 * Magnitude responses overlaid on a log-frequency axis, drawn as static SVG on the server (the
 * diff needs no interaction). The dB axis spans the traces' peak down to at most 100 dB below it;
 * deeper values are drawn on the bottom edge.
 */
export function MagnitudeOverlay({ freqsHz, series, title }: Props) {
  const all = series.flatMap((s) => s.db).filter(Number.isFinite);
  const top = Math.ceil((Math.max(...all, 0) + 3) / 10) * 10;
  const bottom = Math.max(Math.floor(Math.min(...all) / 10) * 10, top - 100);
  const lx = (f: number) => Math.log10(f);
  const x0 = lx(freqsHz[0]);
  const x1 = lx(freqsHz[freqsHz.length - 1]);
  const px = (f: number) => PAD.left + ((lx(f) - x0) / (x1 - x0)) * (W - PAD.left - PAD.right);
  const py = (db: number) => PAD.top + ((top - Math.max(db, bottom)) / (top - bottom)) * (H - PAD.top - PAD.bottom);
  const decades = Array.from({ length: Math.floor(x1) - Math.ceil(x0) + 1 }, (_, i) => 10 ** (Math.ceil(x0) + i));
  const dbTicks = Array.from({ length: Math.floor((top - bottom) / 20) + 1 }, (_, i) => top - i * 20);
  return (
    <figure className="space-y-1">
      <svg viewBox={`0 0 ${W} ${H}`} role="img" aria-label={title} className="w-full max-w-3xl rounded-md bg-canvas" data-testid="magnitude-overlay">
        {decades.map((f) => (
          <g key={f}>
            <line x1={px(f)} x2={px(f)} y1={PAD.top} y2={H - PAD.bottom} stroke="#334155" strokeWidth={0.5} />
            <text x={px(f)} y={H - 10} fill="#94a3b8" fontSize={10} textAnchor="middle">{formatHz(f, 3)}</text>
          </g>
        ))}
        {dbTicks.map((db) => (
          <g key={db}>
            <line x1={PAD.left} x2={W - PAD.right} y1={py(db)} y2={py(db)} stroke="#334155" strokeWidth={0.5} />
            <text x={PAD.left - 6} y={py(db) + 3} fill="#94a3b8" fontSize={10} textAnchor="end">{db} dB</text>
          </g>
        ))}
        {series.map((s) => (
          <polyline
            key={s.label}
            fill="none"
            stroke={s.color}
            strokeWidth={1.6}
            strokeDasharray={s.dashed ? "5 4" : undefined}
            points={s.db.map((db, i) => `${px(freqsHz[i]).toFixed(1)},${py(db).toFixed(1)}`).join(" ")}
          />
        ))}
      </svg>
      <figcaption className="flex gap-4 text-xs text-slate-600 dark:text-slate-300">
        {series.map((s) => (
          <span key={s.label} className="flex items-center gap-1.5">
            <svg width="22" height="6" aria-hidden><line x1="0" x2="22" y1="3" y2="3" stroke={s.color} strokeWidth="2" strokeDasharray={s.dashed ? "5 4" : undefined} /></svg>
            {s.label}
          </span>
        ))}
        <span className="ml-auto">magnitude in dB vs frequency (log)</span>
      </figcaption>
    </figure>
  );
}
