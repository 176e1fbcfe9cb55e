"use client";

import { useMemo, useState } from "react";
import type uPlot from "uplot";
import { staticSource } from "@/components/charts/sources";
import { UPlotChart, type ChartSeries } from "@/components/charts/uplot-chart";
import { Swatch } from "@/components/ui/swatch";
import { fixedPreview, responseCurves, sPlaneRoots, timeCurves, type ResponseCurves, type TimeCurves } from "@/lib/bench/analysis";
import { withUnit } from "@/lib/bench/format";
import { freqGrid, type FilterDesign, type FilterSpec, type QuantFormat } from "@/lib/dsp";
import { PoleZeroMap } from "./pole-zero-map";

/** One filter shown in the analysis views: a candidate or the production filter. */
export interface AnalysisItem {
  id: string;
  name: string;
  color: string;
  spec: FilterSpec | null;
  design: FilterDesign;
}

/** Lowest magnitude the Bode and fixed-point plots range down to, in dB (product choice). */
const MAGNITUDE_FLOOR_DB = -120;

/** Points on the log frequency grid of the analysis plots. */
const GRID_POINTS = 600;

function safe<T>(fn: () => T): T | null {
  try {
    return fn();
  } catch {
    return null;
  }
}

export function useFrequencyGrid(sampleRateHz: number): number[] {
  return useMemo(() => freqGrid(sampleRateHz, GRID_POINTS, "log"), [sampleRateHz]);
}

function useCurves(items: AnalysisItem[], freqs: number[]): (ResponseCurves | null)[] {
  return useMemo(() => items.map((it) => safe(() => responseCurves(it.spec, it.design, freqs))), [items, freqs]);
}

const hzAxis = { kind: "log" as const, label: "Frequency (Hz)", unit: "Hz" };

function Chart({ title, testId, series, data, yLabel, kind = "log", height = 220, axes, floor }: {
  title: string;
  testId: string;
  series: ChartSeries[];
  data: uPlot.AlignedData;
  yLabel: string;
  kind?: "log" | "linear";
  height?: number;
  axes?: { scale: string; label: string; side?: "left" | "right"; format?: (v: number) => string }[];
  floor?: number;
}) {
  const source = useMemo(() => staticSource(data), [data]);
  return (
    <figure className="m-0">
      <figcaption className="mb-1 text-xs font-medium text-slate-600 dark:text-slate-300">{title}</figcaption>
      <div className="rounded-md bg-canvas p-2">
        <UPlotChart
          label={title}
          testId={testId}
          series={series}
          source={source}
          x={kind === "log" ? hzAxis : { kind: "linear", label: "Time (ms)", unit: "ms" }}
          axes={axes ?? [{ scale: "y", label: yLabel, floor }]}
          height={height}
        />
      </div>
    </figure>
  );
}

/** Bode magnitude and phase on a log frequency axis, each digital response beside its analog prototype (dashed) so the warping shows. */
export function ResponseView({ items, freqs }: { items: AnalysisItem[]; freqs: number[] }) {
  const curves = useCurves(items, freqs);
  const { mag, phase, series } = useMemo(() => {
    const series: ChartSeries[] = [];
    const mag: (number | null)[][] = [];
    const phase: (number | null)[][] = [];
    items.forEach((it, i) => {
      const c = curves[i];
      if (!c) return;
      series.push({ label: it.name, color: it.color, unit: "" });
      mag.push(c.magnitudeDb);
      phase.push(c.phaseDeg);
      if (c.analogMagnitudeDb && c.analogPhaseDeg) {
        series.push({ label: `${it.name} (analog)`, color: it.color, unit: "", dash: [5, 4], width: 1 });
        mag.push(c.analogMagnitudeDb);
        phase.push(c.analogPhaseDeg);
      }
    });
    return { series, mag: [freqs, ...mag] as uPlot.AlignedData, phase: [freqs, ...phase] as uPlot.AlignedData };
  }, [items, curves, freqs]);
  return (
    <div className="space-y-3">
      <Chart title="Magnitude (dB)" testId="bode-magnitude" series={series.map((s) => ({ ...s, unit: "dB" }))} data={mag} yLabel="dB" floor={MAGNITUDE_FLOOR_DB} />
      <Chart title="Phase (°)" testId="bode-phase" series={series.map((s) => ({ ...s, unit: "°" }))} data={phase} yLabel="degrees" height={180} />
      <p className="text-xs text-slate-500">Dashed: the analog prototype (no prewarping) — where it departs from the solid line, the bilinear map has warped the frequency axis.</p>
    </div>
  );
}

/** Group delay in samples (left axis) and ms (right axis). */
export function DelayView({ items, freqs, sampleRateHz }: { items: AnalysisItem[]; freqs: number[]; sampleRateHz: number }) {
  const curves = useCurves(items, freqs);
  const shown = items.map((it, i) => ({ it, c: curves[i] })).filter((x): x is { it: AnalysisItem; c: ResponseCurves } => x.c !== null);
  const data = useMemo(() => [freqs, ...shown.map((x) => x.c.groupDelaySamples)] as uPlot.AlignedData, [shown, freqs]);
  const ms = (v: number) => withUnit((1000 * v) / sampleRateHz, "", 3);
  return (
    <Chart
      title="Group delay (samples, and ms on the right)"
      testId="group-delay"
      series={shown.map((x) => ({ label: x.it.name, color: x.it.color, unit: "samples" }))}
      data={data}
      yLabel="samples"
      height={260}
      axes={[
        { scale: "y", label: "samples" },
        { scale: "y", label: "ms", side: "right", format: ms },
      ]}
    />
  );
}

/** Pole-zero maps: the z-plane of every design and the s-plane of analog prototypes. */
export function PolesView({ items }: { items: AnalysisItem[] }) {
  const analog = useMemo(
    () => items.flatMap((it) => {
      const roots = it.spec ? safe(() => sPlaneRoots(it.spec!)) : null;
      return roots ? [{ name: it.name, color: it.color, ...roots }] : [];
    }),
    [items],
  );
  return (
    <div className="grid gap-4 sm:grid-cols-2">
      <PoleZeroMap plane="z" label="Pole-zero map in the z-plane" sets={items.map((it) => ({ name: it.name, color: it.color, zeros: it.design.zeros, poles: it.design.poles }))} />
      {analog.length > 0 ? (
        <PoleZeroMap plane="s" label="Pole-zero map of the analog prototypes in the s-plane" sets={analog} />
      ) : (
        <p className="text-sm text-slate-500">No analog prototype: the s-plane map appears for IIR designs and analog H(s).</p>
      )}
    </div>
  );
}

/** Step and impulse responses with rise, overshoot and settling. */
export function StepView({ items }: { items: AnalysisItem[] }) {
  const curves = useMemo(() => items.map((it) => safe(() => timeCurves(it.design))), [items]);
  const { step, impulse, series } = useMemo(() => {
    const shown = items.map((it, i) => ({ it, c: curves[i] })).filter((x): x is { it: AnalysisItem; c: TimeCurves } => x.c !== null);
    const longest = shown.reduce((a, x) => (x.c.timeS.length > a.length ? x.c.timeS : a), [] as number[]);
    const pad = (v: number[]) => longest.map((_, k) => (k < v.length ? v[k] : null));
    return {
      series: shown.map((x) => ({ label: x.it.name, color: x.it.color, unit: "" })),
      step: [longest.map((t) => t * 1000), ...shown.map((x) => pad(x.c.step))] as uPlot.AlignedData,
      impulse: [longest.map((t) => t * 1000), ...shown.map((x) => pad(x.c.impulse))] as uPlot.AlignedData,
    };
  }, [items, curves]);
  return (
    <div className="space-y-3">
      <Chart title="Step response" testId="step-response" kind="linear" series={series} data={step} yLabel="output" />
      <Chart title="Impulse response" testId="impulse-response" kind="linear" series={series} data={impulse} yLabel="output" height={180} />
      <table className="num w-full text-xs">
        <thead className="text-left text-slate-500">
          <tr>
            <th className="py-1 font-medium">Filter</th>
            <th className="font-medium">Rise 10–90 %</th>
            <th className="font-medium">Overshoot</th>
            <th className="font-medium">Settling 2 %</th>
            <th className="font-medium">Final value</th>
          </tr>
        </thead>
        <tbody>
          {items.map((it, i) => {
            const m = curves[i]?.metrics;
            return (
              <tr key={it.id} className="border-t border-slate-200 dark:border-slate-800">
                <td className="py-1">
                  <span className="flex items-center gap-1.5 font-sans">
                    <Swatch color={it.color} /> {it.name}
                  </span>
                </td>
                <td>{withUnit(m?.riseTimeS == null ? null : m.riseTimeS * 1000, "ms")}</td>
                <td>{withUnit(m?.overshootPercent, "%")}</td>
                <td>{withUnit(m?.settlingTimeS == null ? null : m.settlingTimeS * 1000, "ms")}</td>
                <td>{withUnit(m?.finalValue, "", 4)}</td>
              </tr>
            );
          })}
        </tbody>
      </table>
    </div>
  );
}

const FORMAT_COLORS: Record<QuantFormat, string> = { f32: "#56b4e9", q31: "#009e73", q15: "#f0e442" };

/** The float64 magnitude with f32, Q31 and Q15 quantizations overlaid; stability and largest deviation per format. */
export function FixedView({ items, freqs, deviceFormat }: { items: AnalysisItem[]; freqs: number[]; deviceFormat: QuantFormat }) {
  const [chosen, setChosen] = useState<string>("");
  const item = items.find((it) => it.id === chosen) ?? items[0];
  const result = useMemo(() => {
    if (!item) return null;
    const float = safe(() => responseCurves(null, item.design, freqs));
    return { float, formats: fixedPreview(item.design, freqs) };
  }, [item, freqs]);
  if (!item || !result) return null;
  const series: ChartSeries[] = [{ label: "float64", color: "#e2e8f0", unit: "dB", width: 2 }];
  const cols: (number | null)[][] = [result.float?.magnitudeDb ?? freqs.map(() => null)];
  for (const f of result.formats) {
    if (!f.magnitudeDb) continue;
    series.push({ label: f.format.toUpperCase(), color: FORMAT_COLORS[f.format], unit: "dB", dash: [4, 3] });
    cols.push(f.magnitudeDb);
  }
  return (
    <div className="space-y-3">
      <label className="flex items-center gap-2 text-sm">
        <span className="text-slate-500">Filter</span>
        <select className="field w-auto py-1" value={item.id} onChange={(e) => setChosen(e.target.value)}>
          {items.map((it) => (
            <option key={it.id} value={it.id}>
              {it.name}
            </option>
          ))}
        </select>
      </label>
      <Chart title={`${item.name}: magnitude quantized vs float64 (dB)`} testId="fixed-point" series={series} data={[freqs, ...cols] as uPlot.AlignedData} yLabel="dB" floor={MAGNITUDE_FLOOR_DB} />
      <table className="num w-full text-xs">
        <thead className="text-left text-slate-500">
          <tr>
            <th className="py-1 font-medium">Format</th>
            <th className="font-medium">Stable</th>
            <th className="font-medium">Largest change</th>
          </tr>
        </thead>
        <tbody>
          {result.formats.map((f) => (
            <tr key={f.format} className="border-t border-slate-200 dark:border-slate-800">
              <td className="py-1">
                {f.format.toUpperCase()}
                {f.format === deviceFormat && <span className="ml-1 font-sans text-slate-500">(this device)</span>}
              </td>
              <td className={f.stable === false ? "text-red-700 dark:text-red-300" : ""}>{f.error ? "—" : f.stable ? "yes" : "no — unstable"}</td>
              <td>{f.error ? <span className="font-sans">{f.error}</span> : withUnit(f.maxDeviationDb, "dB")}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
