import { Swatch } from "@/components/ui/swatch";
import { hz, withUnit } from "@/lib/bench/format";
import type { LiveSpectrum } from "@/lib/bench/spectrum";
import type { SeedMode } from "./spectrum-panel";

/** One trace's spectrum level at each peak, in dB (null where it has no spectrum yet). */
export interface PeakLevels {
  id: string;
  label: string;
  color: string;
  levelsDb: (number | null)[];
}

/**
 * A spectrum's strongest peaks with their prominence; with `onSeed`, each can seed a notch or a cutoff.
 * With `levels` (the first being the trace the peaks are of), each other trace's change at the peak.
 */
export function PeakList({ peaks, testId, onSeed, levels = [] }: { peaks: LiveSpectrum["peaks"]; testId: string; onSeed?: (freqHz: number, mode: SeedMode) => void; levels?: PeakLevels[] }) {
  const [lead, ...others] = levels;
  return (
    <ol className="space-y-1" data-testid={testId}>
      {peaks.map((p, k) => (
        <li key={p.freqHz} className="text-sm" data-hz={p.freqHz} data-levels={JSON.stringify(Object.fromEntries(levels.map((l) => [l.id, l.levelsDb[k]])))}>
          <div className="flex items-center gap-2">
            <span className="num w-20">{hz(p.freqHz, 4)}</span>
            <span className="num w-14 text-xs text-slate-500">{withUnit(p.prominenceDb, "dB", 2)}</span>
            {onSeed && (
              <span className="ml-auto flex gap-1">
                <button type="button" className="btn-quiet px-1.5 py-0.5 text-xs" onClick={() => onSeed(p.freqHz, "notch")} aria-label={`Notch at ${hz(p.freqHz, 4)}`}>
                  Notch
                </button>
                <button type="button" className="btn-quiet px-1.5 py-0.5 text-xs" onClick={() => onSeed(p.freqHz, "cutoff")} aria-label={`Cutoff at ${hz(p.freqHz, 4)}`}>
                  Cutoff
                </button>
              </span>
            )}
          </div>
          {others.length > 0 && (
            <div className="num flex flex-wrap gap-x-2 pl-1 text-xs text-slate-500">
              {others.map((o) => {
                const base = lead.levelsDb[k];
                const level = o.levelsDb[k];
                return (
                  <span key={o.id} className="flex items-center gap-1" title={`${o.label} relative to ${lead.label} at this peak`}>
                    <Swatch color={o.color} />
                    {base === null || level === null ? "—" : withUnit(level - base, "dB", 2)}
                  </span>
                );
              })}
            </div>
          )}
        </li>
      ))}
    </ol>
  );
}
