"use client";

import { useCallback, useDeferredValue, useMemo, useState, useSyncExternalStore } from "react";
import { Notice } from "@/components/ui/notice";
import { Segmented } from "@/components/ui/segmented";
import { REVIEW_LINE } from "@/lib/bench/cautions";
import { filterPhaseCost, stabilityMargins, type PhaseCost } from "@/lib/dsp/loop";
import { analyseLoop, bodeFrequencies, locusData, parseInputs, stepLength, withFilter, type LocusData, type LoopAnalysis } from "./analysis";
import { loopCautions } from "./cautions";
import { WITH_COLOR, WITHOUT_COLOR } from "./colors";
import { DEMO_INPUTS, type LoopInputs } from "./defaults";
import { FilterSource, type PickedFilter } from "./filter-source";
import { BodeCharts, StepChart } from "./loop-charts";
import { LoopInputsForm } from "./loop-inputs-form";
import { MarginsTable } from "./margins-table";
import { RootLocus, type LocusView } from "./root-locus";

/** The analysis never re-subscribes: `useSyncExternalStore` only tells the server render (false) from the browser (true). */
const NO_CHANGES = () => () => {};

function attempt<T>(fn: () => T): { value: T } | { error: string } {
  try {
    return { value: fn() };
  } catch (err) {
    return { error: err instanceof Error ? err.message : "the computation failed" };
  }
}

interface Results {
  without: LoopAnalysis;
  withF: LoopAnalysis | null;
  lag: PhaseCost | null;
  locusWithout: LocusData;
  locusWith: LocusData | null;
  warnings: string[];
}

/**
 * The loop check of one channel: the sensor filter, plant and controller on the left, and with/without
 * comparisons (margins, Bode, closed-loop step, root locus, cautions). Everything is computed in the
 * browser with lib/dsp/loop, so every edit re-plots at once.
 */
export function LoopCheck({ channel }: { channel: { path: string; name: string; sampleRateHz: number } }) {
  const fs = channel.sampleRateHz;
  const [inputs, setInputs] = useState<LoopInputs>(DEMO_INPUTS);
  const [picked, setPicked] = useState<PickedFilter>({ design: null, reason: "Loading…" });
  const [view, setView] = useState<LocusView>("near-one");
  const onPick = useCallback((f: PickedFilter) => setPicked(f), []);
  // The analysis runs in the browser only (the server's floating point may differ in the last bits, and it saves the server the work).
  const mounted = useSyncExternalStore(NO_CHANGES, () => true, () => false);

  const parsed = useMemo(() => parseInputs(inputs, fs), [inputs, fs]);
  const freqs = useMemo(() => bodeFrequencies(fs), [fs]);
  const model = useDeferredValue(parsed.ok ? parsed.model : null);
  const filter = useDeferredValue(picked.design);

  const results = useMemo(() => {
    if (!model || !mounted) return null;
    return attempt((): Results => {
      const base = withFilter(model, null);
      const margins = stabilityMargins(base);
      const n = stepLength(fs, margins.gainCrossoverHz);
      const without = analyseLoop(base, freqs, n, margins);
      const withModel = filter ? withFilter(model, filter) : null;
      const withF = withModel ? analyseLoop(withModel, freqs, n) : null;
      const fc = without.margins.gainCrossoverHz;
      const lag = filter && fc !== null ? filterPhaseCost(filter, fc) : null;
      const warnings = [without.poles.warning, withF?.poles.warning].filter((w): w is string => !!w);
      return { without, withF, lag, locusWithout: locusData(base), locusWith: withModel ? locusData(withModel) : null, warnings };
    });
  }, [model, filter, freqs, fs, mounted]);

  const r = results && "value" in results ? results.value : null;
  const cautions = r ? loopCautions(r.without, r.withF, r.lag, r.without.margins.gainCrossoverHz) : [];

  return (
    <div className="space-y-4">
      <div className="grid gap-4 lg:grid-cols-2 2xl:grid-cols-[minmax(0,22rem)_minmax(0,22rem)_minmax(0,1fr)]">
        <FilterSource path={channel.path} sampleRateHz={fs} onPick={onPick} />
        <LoopInputsForm inputs={inputs} onChange={setInputs} errors={parsed.ok ? [] : parsed.errors} />
        <section className="card space-y-3 p-4 lg:col-span-2 2xl:col-span-1" aria-label="Margins and cautions">
          <h2 className="font-medium">Margins</h2>
          {!mounted && <Notice title="Computing the loop…">The margins, plots and root locus are computed in your browser.</Notice>}
          {!parsed.ok && <Notice tone="warn" title="Fix the plant or controller">The loop is drawn again as soon as every field is valid.</Notice>}
          {results && "error" in results && <Notice tone="error" title="The loop could not be computed">{results.error}</Notice>}
          {r && <MarginsTable without={r.without} withF={r.withF} lag={r.lag} />}
          {r && !r.withF && <Notice title="Without a filter only">{picked.design ? "Computing…" : "reason" in picked ? picked.reason : ""}</Notice>}
          {r?.warnings.map((w) => <Notice key={w} tone="warn" title="Closed-loop poles are indicative">{w}</Notice>)}
          {cautions.length > 0 && (
            <ul className="space-y-2" aria-label="Loop cautions">
              {cautions.map((c) => (
                <li key={c.id} data-caution={c.id} className="rounded-md border border-amber-300 bg-amber-50 px-3 py-2 text-sm text-amber-950 dark:border-amber-700/60 dark:bg-amber-950/30 dark:text-amber-100">
                  <p className="font-medium">{c.title}</p>
                  <p className="mt-0.5">{c.text}</p>
                  <p className="mt-1 text-xs opacity-80">{REVIEW_LINE}</p>
                </li>
              ))}
            </ul>
          )}
          <p className="text-xs text-slate-500">
            Targets: phase margin ≥ 45°, gain margin ≥ 6 dB (typical; Franklin, Powell &amp; Emami-Naeini). Margins read L = C·z⁻ᵈ·P·F on a dense log grid; the worst crossing is shown. The step is the plant output with the filter in the measurement path.
          </p>
        </section>
      </div>
      {r && (
        <>
          <section className="card p-4" aria-label="Bode plot of the loop">
            <BodeCharts freqs={freqs} without={r.without} withF={r.withF} />
          </section>
          <div className="grid gap-4 xl:grid-cols-2">
            <section className="card p-4" aria-label="Closed-loop step">
              <StepChart without={r.without} withF={r.withF} />
            </section>
            <section className="card space-y-3 p-4" aria-label="Root locus">
              <div className="flex flex-wrap items-center gap-3">
                <h2 className="text-xs font-medium text-slate-600 dark:text-slate-300">Root locus of 1 + k·L(z), k from 0.01 to 100</h2>
                <Segmented
                  label="Root locus window"
                  value={view}
                  onChange={setView}
                  options={[
                    { value: "near-one", label: "Near z = 1" },
                    { value: "circle", label: "Unit circle" },
                  ]}
                />
              </div>
              <div className="grid grid-cols-2 gap-3">
                <RootLocus data={r.locusWithout} color={WITHOUT_COLOR} title="Without filter" view={view} testId="locus-without" />
                {r.locusWith ? <RootLocus data={r.locusWith} color={WITH_COLOR} title="With filter" view={view} testId="locus-with" /> : <div />}
              </div>
              <p className="text-xs text-slate-500">× open-loop poles (k = 0), ○ zeros, ◆ closed-loop poles at the current gain (red when unstable), dashed unit circle.</p>
            </section>
          </div>
        </>
      )}
    </div>
  );
}

