import { hz, withUnit } from "@/lib/bench/format";
import type { LiveSpectrum } from "@/lib/bench/spectrum";
import type { SeedMode } from "./spectrum-panel";

/** A spectrum's strongest peaks with their prominence; with `onSeed`, each can seed a notch or a cutoff. */
export function PeakList({ peaks, testId, onSeed }: { peaks: LiveSpectrum["peaks"]; testId: string; onSeed?: (freqHz: number, mode: SeedMode) => void }) {
  return (
    <ol className="space-y-1" data-testid={testId}>
      {peaks.map((p) => (
        <li key={p.freqHz} className="flex items-center gap-2 text-sm">
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
        </li>
      ))}
    </ol>
  );
}
