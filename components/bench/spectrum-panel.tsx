"use client";

import { useEffect, useMemo, useState } from "react";
import type uPlot from "uplot";
import { UPlotChart } from "@/components/charts/uplot-chart";
import { staticSource } from "@/components/charts/sources";
import { Swatch } from "@/components/ui/swatch";
import { useLatest } from "@/components/hooks/use-latest";
import { hz } from "@/lib/bench/format";
import type { LiveStore } from "@/lib/bench/live-store";
import { levelAtDb, liveSpectrum, type LiveSpectrum } from "@/lib/bench/spectrum";
import type { TraceInfo } from "./live-panel";
import { PeakList, type PeakLevels } from "./peak-list";

/** Seconds of signal each spectrum is taken over, and how often it is refreshed (ms). */
const SPECTRUM_SECONDS = 4;
const REFRESH_MS = 500;

export type SeedMode = "notch" | "cutoff";

interface Computed {
  /** Spectrum of the first trace (whose peaks are labelled) and the others on the same bins. */
  lead: LiveSpectrum;
  others: (number[] | null)[];
}

function compute(store: LiveStore, traces: TraceInfo[]): Computed | null {
  const [first, ...rest] = traces;
  if (!first) return null;
  const samples = store.recent(first.slot, SPECTRUM_SECONDS);
  const lead = liveSpectrum(samples, store.sampleRateHz);
  if (!lead) return null;
  const others = rest.map((t) => {
    const x = store.recent(t.slot, SPECTRUM_SECONDS);
    if (x.length < samples.length) return null;
    return liveSpectrum(x.subarray(x.length - samples.length), store.sampleRateHz, 0)?.psdDb ?? null;
  });
  return { lead, others };
}

/**
 * Welch PSD of live traces on a log frequency axis (the first trace's strongest peaks labelled in Hz),
 * refreshed twice a second. With `onSeed`, a peak (or a click on the chart) seeds a notch or a cutoff.
 */
export function SpectrumPanel({
  store,
  traces,
  unit,
  title,
  onSeed,
  onPeaks,
  onJudge,
  judgedHz,
}: {
  store: LiveStore;
  traces: TraceInfo[];
  unit: string;
  title: string;
  onSeed?: (freqHz: number, mode: SeedMode) => void;
  onPeaks?: (peaksHz: number[]) => void;
  /** Makes a peak the noise line the attenuation figures are judged at; `judgedHz` is the one judged now. */
  onJudge?: (freqHz: number) => void;
  judgedHz?: number | null;
}) {
  const [computed, setComputed] = useState<Computed | null>(null);
  const [paused, setPaused] = useState(false);
  const key = traces.map((t) => `${t.id}:${t.slot}`).join(",");
  const tracesRef = useLatest(traces);
  const onPeaksRef = useLatest(onPeaks);
  useEffect(() => {
    if (paused) return;
    const tick = () => {
      const c = compute(store, tracesRef.current);
      setComputed(c);
      if (c) onPeaksRef.current?.(c.lead.peaks.map((p) => p.freqHz));
    };
    tick();
    const id = setInterval(tick, REFRESH_MS);
    return () => clearInterval(id);
  }, [store, key, paused, tracesRef, onPeaksRef]);

  const source = useMemo(() => {
    if (!computed) return staticSource([[], ...traces.map(() => [])] as uPlot.AlignedData);
    const { freqsHz, psdDb } = computed.lead;
    const from = freqsHz[0] === 0 ? 1 : 0;
    return staticSource([freqsHz.slice(from), psdDb.slice(from), ...computed.others.map((o) => (o ? o.slice(from) : freqsHz.slice(from).map(() => null)))] as uPlot.AlignedData);
    // A new source only with a new computation: the traces' identity changes on every render, and the
    // computation follows their slots (`key`) within one refresh.
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [computed]);
  const peaks = computed?.lead.peaks ?? [];
  const marks = peaks.map((p) => ({ x: p.freqHz, label: hz(p.freqHz, 3) }));
  // Every trace's level at each labelled peak, so a candidate's drop below the lead trace reads as a number.
  const levels: PeakLevels[] = computed
    ? traces.map((t, i) => {
        const psd = i === 0 ? computed.lead.psdDb : computed.others[i - 1];
        return { id: t.id, label: t.label, color: t.color, levelsDb: peaks.map((p) => (psd ? levelAtDb(computed.lead.freqsHz, psd, p.freqHz) : null)) };
      })
    : [];
  const nearestPeak = (f: number) => {
    let best: number | null = null;
    for (const p of peaks) if (Math.abs(Math.log(p.freqHz / f)) < 0.08 && (best === null || Math.abs(p.freqHz - f) < Math.abs(best - f))) best = p.freqHz;
    return best ?? f;
  };

  return (
    <section aria-label={title} className="card overflow-hidden">
      <div className="flex flex-wrap items-center gap-3 border-b border-slate-200 px-4 py-2.5 dark:border-slate-800">
        <h2 className="font-medium">{title}</h2>
        <span className="text-xs text-slate-500">
          Welch PSD over the last {SPECTRUM_SECONDS} s, dB re 1 {unit}²/Hz
        </span>
        <button type="button" className="btn-quiet ml-auto py-1" aria-pressed={paused} onClick={() => setPaused(!paused)}>
          {paused ? "Resume" : "Hold"}
        </button>
      </div>
      <div className="grid gap-3 p-3 lg:grid-cols-[1fr_19rem]">
        <div className="min-w-0 rounded-md bg-canvas p-2">
          {!computed && <p className="px-2 py-1 text-sm text-slate-300">Waiting for a few seconds of samples to estimate the spectrum…</p>}
          <UPlotChart
            label={`${title}: power spectral density against frequency`}
            testId="spectrum-chart"
            series={traces.map((t) => ({ label: t.label, color: t.color, unit: "dB", width: t.id === "raw" ? 1 : 1.5 }))}
            source={source}
            x={{ kind: "log", label: "Frequency (Hz)", unit: "Hz" }}
            axes={[{ scale: "y", label: "PSD (dB)" }]}
            height={240}
            marks={marks}
            onPick={onSeed ? (f) => onSeed(nearestPeak(f), "notch") : undefined}
          />
        </div>
        <div>
          <h3 className="label flex items-center gap-1.5">
            <Swatch color={traces[0]?.color ?? "#94a3b8"} /> Strongest peaks (level)
          </h3>
          {peaks.length === 0 ? (
            <p className="text-sm text-slate-500">{computed ? "No clear peaks (none 10 dB above its surroundings)." : "Estimating…"}</p>
          ) : (
            <PeakList peaks={peaks} levels={levels} testId="spectrum-peaks" onSeed={onSeed} onJudge={onJudge} judgedHz={judgedHz} />
          )}
          {onSeed && <p className="mt-2 text-xs text-slate-500">Click a peak on the chart to add a notch stage to the candidate being edited, or to start a candidate.</p>}
        </div>
      </div>
    </section>
  );
}
