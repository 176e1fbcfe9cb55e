"use client";

import { useMemo } from "react";
import type uPlot from "uplot";
import { staticSource } from "@/components/charts/sources";
import { UPlotChart, type ChartMark, type ChartSeries } from "@/components/charts/uplot-chart";
import { withUnit } from "@/lib/bench/format";
import type { LoopAnalysis } from "./analysis";
import { GUIDE_COLOR, WITH_COLOR, WITHOUT_COLOR } from "./colors";

function Figure({ title, children }: { title: string; children: React.ReactNode }) {
  return (
    <figure className="m-0">
      <figcaption className="mb-1 text-xs font-medium text-slate-600 dark:text-slate-300">{title}</figcaption>
      <div className="rounded-md bg-canvas p-2">{children}</div>
    </figure>
  );
}

/** Both series always exist (the wrapper keeps one series set per chart); without a filter its column is empty. */
const pair = (unit: string): ChartSeries[] => [
  { label: "Without filter", color: WITHOUT_COLOR, unit, width: 1.5 },
  { label: "With filter", color: WITH_COLOR, unit, width: 1.5 },
];

const orGap = (values: number[] | undefined, length: number): (number | null)[] => values ?? new Array<null>(length).fill(null);

/** Crossovers closer than this (as a frequency ratio) share one label: "fc 8.82 Hz (with and without)". */
const SAME_CROSSOVER = 1.01;

function crossoverMarks(without: LoopAnalysis, withF: LoopAnalysis | null, kinds: ("gain" | "phase")[]): ChartMark[] {
  const marks: ChartMark[] = [];
  for (const kind of kinds) {
    const name = kind === "gain" ? "fc" : "f180";
    const at = (a: LoopAnalysis | null) => (a === null ? null : kind === "gain" ? a.margins.gainCrossoverHz : a.margins.phaseCrossoverHz);
    const [off, on] = [at(without), at(withF)];
    if (off !== null && on !== null && Math.max(off / on, on / off) < SAME_CROSSOVER) {
      marks.push({ x: off, label: `${name} ${withUnit(off, "Hz", 3)} (with and without)` });
      continue;
    }
    if (off !== null) marks.push({ x: off, label: `${name} without ${withUnit(off, "Hz", 3)}` });
    if (on !== null) marks.push({ x: on, label: `${name} with ${withUnit(on, "Hz", 3)}` });
  }
  // The chart puts labels on two rows, alternating in the order given: in frequency order, labels
  // next to each other on the axis land on different rows and do not overlap.
  return marks.sort((a, b) => a.x - b.x);
}

/** Depth shown below the lowest point of the loop without the filter, so a filter's notch or Nyquist zero does not flatten the plot. */
const MAGNITUDE_DEPTH_DB = 60;

function magnitudeRange(without: number[], withF: number[] | null): [number, number] {
  const all = [...without, ...(withF ?? [])].filter(Number.isFinite);
  const top = Math.max(...all);
  const bottom = Math.max(Math.min(...all), Math.min(...without.filter(Number.isFinite)) - MAGNITUDE_DEPTH_DB);
  return [Math.floor(bottom / 20) * 20, Math.ceil(top / 20) * 20];
}

/** Bode plot of L(e^{jω}) with and without the filter: magnitude (0 dB guide, gain crossovers) and phase (−180° guide, phase crossovers). */
export function BodeCharts({ freqs, without, withF }: { freqs: number[]; without: LoopAnalysis; withF: LoopAnalysis | null }) {
  const mag = useMemo(() => {
    return staticSource([freqs, without.response.magnitudeDb, orGap(withF?.response.magnitudeDb, freqs.length), freqs.map(() => 0)] as uPlot.AlignedData);
  }, [freqs, without, withF]);
  const phase = useMemo(() => {
    return staticSource([freqs, without.response.phaseDeg, orGap(withF?.response.phaseDeg, freqs.length), freqs.map(() => -180)] as uPlot.AlignedData);
  }, [freqs, without, withF]);
  const hzAxis = { kind: "log" as const, label: "Frequency (Hz)", unit: "Hz" };
  return (
    <div className="grid gap-4 xl:grid-cols-2">
      <Figure title="Loop gain |L| (dB)">
        <UPlotChart
          label="Loop gain magnitude"
          testId="loop-bode-magnitude"
          series={[...pair("dB"), { label: "0 dB", color: GUIDE_COLOR, unit: "dB", dash: [4, 4], width: 1 }]}
          source={mag}
          x={hzAxis}
          axes={[{ scale: "y", label: "dB" }]}
          marks={crossoverMarks(without, withF, ["gain"])}
          yRange={magnitudeRange(without.response.magnitudeDb, withF?.response.magnitudeDb ?? null)}
          height={240}
        />
      </Figure>
      <Figure title="Loop phase arg L (°)">
        <UPlotChart
          label="Loop phase"
          testId="loop-bode-phase"
          series={[...pair("°"), { label: "−180°", color: GUIDE_COLOR, unit: "°", dash: [4, 4], width: 1 }]}
          source={phase}
          x={hzAxis}
          axes={[{ scale: "y", label: "°" }]}
          marks={crossoverMarks(without, withF, ["gain", "phase"])}
          height={240}
        />
      </Figure>
    </div>
  );
}

/** Beyond this the step is off the chart (an unstable loop); the sample is left as a gap. */
const STEP_CLIP = 10;

/** Closed-loop plant output for a unit reference step, with and without the filter, against time in ms. */
export function StepChart({ without, withF }: { without: LoopAnalysis; withF: LoopAnalysis | null }) {
  const source = useMemo(() => {
    const clip = (ys: number[]) => ys.map((y) => (Number.isFinite(y) && Math.abs(y) <= STEP_CLIP ? y : null));
    const t = without.step.timeS.map((s) => s * 1000);
    return staticSource([t, clip(without.step.output), withF ? clip(withF.step.output) : orGap(undefined, t.length), t.map(() => 1)] as uPlot.AlignedData);
  }, [without, withF]);
  return (
    <Figure title="Closed-loop step: plant output for a unit reference step">
      <UPlotChart
        label="Closed-loop step response"
        testId="loop-step"
        series={[...pair(""), { label: "Reference", color: GUIDE_COLOR, unit: "", dash: [4, 4], width: 1 }]}
        source={source}
        x={{ kind: "linear", label: "Time (ms)", unit: "ms" }}
        axes={[{ scale: "y", label: "× step" }]}
        height={260}
      />
    </Figure>
  );
}
