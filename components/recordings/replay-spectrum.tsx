"use client";

import { useMemo } from "react";
import type uPlot from "uplot";
import { staticSource } from "@/components/charts/sources";
import { UPlotChart } from "@/components/charts/uplot-chart";
import { PeakList } from "@/components/bench/peak-list";
import type { SeedMode } from "@/components/bench/spectrum-panel";
import { Swatch } from "@/components/ui/swatch";
import { hz, withUnit } from "@/lib/bench/format";
import type { LiveSpectrum } from "@/lib/bench/spectrum";
import type { ReplayTrace } from "./replay-trace";

export interface TraceSpectrum {
  trace: ReplayTrace;
  spectrum: LiveSpectrum | null;
}

/**
 * Welch PSD of the recording's longest stretch without missing samples, for the raw trace (its
 * strongest peaks labelled, and seeding a notch or cutoff when `onSeed` is given) and the shown candidates.
 */
export function ReplaySpectrum({
  spectra,
  unit,
  stretchSeconds,
  onSeed,
  onJudge,
  judgedHz,
}: {
  spectra: TraceSpectrum[];
  unit: string;
  stretchSeconds: number;
  onSeed?: (freqHz: number, mode: SeedMode) => void;
  /** Makes a peak the noise line the comparison judges attenuation at; `judgedHz` is the one judged now. */
  onJudge?: (freqHz: number) => void;
  judgedHz?: number | null;
}) {
  const lead = spectra[0]?.spectrum ?? null;
  const source = useMemo(() => {
    if (!lead) return staticSource([[], ...spectra.map(() => [])] as uPlot.AlignedData);
    const from = lead.freqsHz[0] === 0 ? 1 : 0;
    return staticSource([lead.freqsHz.slice(from), ...spectra.map((s) => (s.spectrum ? s.spectrum.psdDb.slice(from) : lead.freqsHz.slice(from).map(() => null)))] as uPlot.AlignedData);
  }, [spectra, lead]);
  const peaks = lead?.peaks ?? [];
  return (
    <section aria-label="Recording spectrum" className="card overflow-hidden">
      <div className="flex flex-wrap items-center gap-3 border-b border-slate-200 px-4 py-2.5 dark:border-slate-800">
        <h2 className="font-medium">Spectrum</h2>
        <span className="text-xs text-slate-500">
          Welch PSD over {withUnit(stretchSeconds, "s")} without missing samples, dB re 1 {unit}²/Hz
        </span>
      </div>
      <div className="grid gap-3 p-3 lg:grid-cols-[1fr_16rem]">
        <div className="min-w-0 rounded-md bg-canvas p-2">
          {!lead && <p className="px-2 py-1 text-sm text-slate-300">Too few samples without gaps for a spectrum (at least 64 are needed).</p>}
          <UPlotChart
            label="Recording spectrum: power spectral density against frequency"
            testId="recording-spectrum"
            series={spectra.map((s) => ({ label: s.trace.label, color: s.trace.color, unit: "dB", width: s.trace.id === "raw" ? 1 : 1.5 }))}
            source={source}
            x={{ kind: "log", label: "Frequency (Hz)", unit: "Hz" }}
            axes={[{ scale: "y", label: "PSD (dB)" }]}
            height={240}
            marks={peaks.map((p) => ({ x: p.freqHz, label: hz(p.freqHz, 3) }))}
            onPick={onSeed ? (f) => onSeed(f, "notch") : undefined}
          />
        </div>
        <div>
          <h3 className="label flex items-center gap-1.5">
            <Swatch color={spectra[0]?.trace.color ?? "#94a3b8"} /> Strongest peaks
          </h3>
          {peaks.length === 0 ? (
            <p className="text-sm text-slate-500">No clear peaks (none 10 dB above its surroundings).</p>
          ) : (
            <PeakList peaks={peaks} testId="recording-peaks" onSeed={onSeed} onJudge={onJudge} judgedHz={judgedHz} />
          )}
        </div>
      </div>
    </section>
  );
}
