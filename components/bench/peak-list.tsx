import { Swatch } from "@/components/ui/swatch";
import { hz, withUnit } from "@/lib/bench/format";
import { powerToDb } from "@/lib/dsp";
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
 * A spectrum's peaks as given (findPeaks: strongest level first), each with its level; with `onSeed`, each
 * can seed a notch or a cutoff; with `onJudge`, each can become the noise line the attenuation figures
 * are judged at (`judgedHz` marks the one that is). With `levels` (the first being the trace the peaks
 * are of), each other trace's change at the peak.
 */
export function PeakList({
  peaks,
  testId,
  onSeed,
  onJudge,
  judgedHz = null,
  levels = [],
}: {
  peaks: LiveSpectrum["peaks"];
  testId: string;
  onSeed?: (freqHz: number, mode: SeedMode) => void;
  onJudge?: (freqHz: number) => void;
  judgedHz?: number | null;
  levels?: PeakLevels[];
}) {
  const [lead, ...others] = levels;
  return (
    <ol className="space-y-1" data-testid={testId}>
      {peaks.map((p, k) => (
        <li key={p.freqHz} className="text-sm" data-hz={p.freqHz} data-levels={JSON.stringify(Object.fromEntries(levels.map((l) => [l.id, l.levelsDb[k]])))}>
          <div className="flex items-center gap-2">
            <span className="num w-20 shrink-0">{hz(p.freqHz, 4)}</span>
            <span className="num w-16 shrink-0 text-xs text-slate-500" title="Level: the PSD at the peak, dB re 1 unit²/Hz">
              {withUnit(powerToDb(p.psd), "dB", 3)}
            </span>
            {(onSeed || onJudge) && (
              <span className="ml-auto flex gap-1">
                {onJudge && (
                  <button
                    type="button"
                    className="btn-quiet px-1.5 py-0.5 text-xs"
                    aria-pressed={judgedHz === p.freqHz}
                    onClick={() => onJudge(p.freqHz)}
                    aria-label={`Judge attenuation at ${hz(p.freqHz, 4)}`}
                    title="Judge the attenuation figures at this line"
                  >
                    Judge
                  </button>
                )}
                {onSeed && (
                  <>
                    <button type="button" className="btn-quiet px-1.5 py-0.5 text-xs" onClick={() => onSeed(p.freqHz, "notch")} aria-label={`Notch at ${hz(p.freqHz, 4)}`}>
                      Notch
                    </button>
                    <button type="button" className="btn-quiet px-1.5 py-0.5 text-xs" onClick={() => onSeed(p.freqHz, "cutoff")} aria-label={`Cutoff at ${hz(p.freqHz, 4)}`}>
                      Cutoff
                    </button>
                  </>
                )}
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
