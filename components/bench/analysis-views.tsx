"use client";

import { useMemo, useState } from "react";
import type uPlot from "uplot";
import { staticSource } from "@/components/charts/sources";
import { UPlotChart, type ChartSeries } from "@/components/charts/uplot-chart";
import { Swatch } from "@/components/ui/swatch";
import {
  fixedPreview,
  plotGrid,
  responseCurves,
  sPlaneRoots,
  stageCurves,
  stageLevels,
  stageName,
  timeCurves,
  type ResponseCurves,
  type StageCurves,
  type StageLevel,
  type TimeCurves,
} from "@/lib/bench/analysis";
import { STAGE_COLORS } from "@/lib/bench/colors";
import { hz, levelDb, withUnit } from "@/lib/bench/format";
import type { FilterDesign, FilterSpec, QuantFormat } from "@/lib/dsp";
import { PoleZeroMap } from "./pole-zero-map";
import { useDesignZeros, type ZerosState } from "./use-design-zeros";
import { ArithmeticPanel } from "./arithmetic-panel";

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

/** Dash of a chain's stage drawn on its own under the total (the analog prototype's is longer). */
const STAGE_DASH = [2, 3];

/** A zoomed frequency range in Hz shared by the frequency charts, or null for the whole band. */
export type FrequencyView = readonly [number, number] | null;

/** The plot frequencies of the shown filters over the view: dense at and around their notches and resonances (plotGrid). */
export function useFrequencyGrid(items: AnalysisItem[], sampleRateHz: number, view: FrequencyView): number[] {
  return useMemo(() => plotGrid(items.map((it) => it.design), sampleRateHz, GRID_POINTS, view), [items, sampleRateHz, view]);
}

/** The shared zoom of the frequency charts: zooming one zooms the others, and the response is recomputed for the range. */
export interface ViewProps {
  view: FrequencyView;
  onView: (range: [number, number] | null) => void;
}

/** Each item's response, with each of its stages on its own when it is a chain (empty otherwise). */
interface ItemCurves {
  total: ResponseCurves;
  stages: StageCurves[];
}

function useCurves(items: AnalysisItem[], freqs: number[]): (ItemCurves | null)[] {
  return useMemo(
    () => items.map((it) => safe(() => ({ total: responseCurves(it.spec, it.design, freqs), stages: stageCurves(it.spec, it.design, freqs) }))),
    [items, freqs],
  );
}

/** One series per item (solid) followed by its stages (thin, dashed, same colour), with the column each takes. */
function withStages(items: AnalysisItem[], curves: (ItemCurves | null)[], column: (c: ResponseCurves) => number[]): { series: ChartSeries[]; cols: number[][] } {
  const series: ChartSeries[] = [];
  const cols: number[][] = [];
  items.forEach((it, i) => {
    const c = curves[i];
    if (!c) return;
    series.push({ label: it.name, color: it.color, unit: "" });
    cols.push(column(c.total));
    for (const s of c.stages) {
      series.push({ label: `${it.name} · stage ${s.stage + 1}: ${s.summary}`, color: it.color, unit: "", dash: STAGE_DASH, width: 1 });
      cols.push(column(s.curves));
    }
  });
  return { series, cols };
}

const hzAxis = { kind: "log" as const, label: "Frequency (Hz)", unit: "Hz" };

function Chart({ title, testId, series, data, yLabel, kind = "log", height = 220, axes, floor, view, onView }: Partial<ViewProps> & {
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
          view={view}
          onView={onView}
        />
      </div>
    </figure>
  );
}

/**
 * Bode magnitude and phase on a log frequency axis: each digital response beside its analog prototype
 * (long dashes) so the warping shows, and for a chain each stage on its own (short dashes) under the total.
 */
export function ResponseView({ items, freqs, view, onView }: { items: AnalysisItem[]; freqs: number[] } & ViewProps) {
  const curves = useCurves(items, freqs);
  const { mag, phase, series } = useMemo(() => {
    const withMag = withStages(items, curves, (c) => c.magnitudeDb);
    const withPhase = withStages(items, curves, (c) => c.phaseDeg);
    const series = [...withMag.series];
    const mag: (number | null)[][] = [...withMag.cols];
    const phase: (number | null)[][] = [...withPhase.cols];
    items.forEach((it, i) => {
      const c = curves[i]?.total;
      if (!c?.analogMagnitudeDb || !c.analogPhaseDeg) return;
      series.push({ label: `${it.name} (analog)`, color: it.color, unit: "", dash: [5, 4], width: 1 });
      mag.push(c.analogMagnitudeDb);
      phase.push(c.analogPhaseDeg);
    });
    return { series, mag: [freqs, ...mag] as uPlot.AlignedData, phase: [freqs, ...phase] as uPlot.AlignedData };
  }, [items, curves, freqs]);
  const chains = curves.some((c) => (c?.stages.length ?? 0) > 0);
  const analog = curves.some((c) => c?.total.analogMagnitudeDb);
  return (
    <div className="space-y-3">
      <Chart title="Magnitude (dB)" testId="bode-magnitude" series={series.map((s) => ({ ...s, unit: "dB" }))} data={mag} yLabel="dB" floor={MAGNITUDE_FLOOR_DB} view={view} onView={onView} />
      <Chart title="Phase (°)" testId="bode-phase" series={series.map((s) => ({ ...s, unit: "°" }))} data={phase} yLabel="degrees" height={180} view={view} onView={onView} />
      <ZoomNote view={view} />
      {chains && <p className="text-xs text-slate-500">Short dashes: each stage of a chain on its own, in the chain&apos;s colour; the solid line is the whole chain (their product).</p>}
      {analog && <p className="text-xs text-slate-500">Long dashes: the analog prototype (no prewarping) — where it departs from the solid line, the bilinear map has warped the frequency axis.</p>}
    </div>
  );
}

/** Says that the frequency charts are zoomed, and how to see the whole band again. */
function ZoomNote({ view }: { view: FrequencyView }) {
  if (!view) return null;
  return (
    <p className="text-xs text-slate-500" data-testid="frequency-zoom">
      Zoomed to {hz(view[0])}–{hz(view[1])}: the response is recomputed for this range. Double-click a chart to see the whole band.
    </p>
  );
}

/** Group delay in samples (left axis) and ms (right axis); for a chain each stage dashed under the total (delays add). */
export function DelayView({ items, freqs, sampleRateHz, view, onView }: { items: AnalysisItem[]; freqs: number[]; sampleRateHz: number } & ViewProps) {
  const curves = useCurves(items, freqs);
  const { series, data } = useMemo(() => {
    const { series, cols } = withStages(items, curves, (c) => c.groupDelaySamples);
    return { series: series.map((s) => ({ ...s, unit: "samples" })), data: [freqs, ...cols] as uPlot.AlignedData };
  }, [items, curves, freqs]);
  const ms = (v: number) => withUnit((1000 * v) / sampleRateHz, "", 3);
  return (
    <Chart
      title="Group delay (samples, and ms on the right)"
      testId="group-delay"
      series={series}
      data={data}
      yLabel="samples"
      height={260}
      view={view}
      onView={onView}
      axes={[
        { scale: "y", label: "samples" },
        { scale: "y", label: "ms", side: "right", format: ms },
      ]}
    />
  );
}

/** The chain among the items to break down by stage: the one chosen, else the first chain shown. */
function useChosenChain(items: AnalysisItem[]) {
  const [chosen, setChosen] = useState("");
  const chains = items.filter((it) => (it.design.stages?.length ?? 0) > 1);
  return { chains, item: chains.find((it) => it.id === chosen) ?? chains[0], setChosen };
}

/** A select of the shown filters (the fixed-point and stage views look at one at a time). */
function FilterPicker({ items, value, onChange, label = "Filter" }: { items: AnalysisItem[]; value: string; onChange: (id: string) => void; label?: string }) {
  return (
    <label className="flex items-center gap-2 text-sm">
      <span className="text-slate-500">{label}</span>
      <select className="field w-auto py-1" value={value} onChange={(e) => onChange(e.target.value)}>
        {items.map((it) => (
          <option key={it.id} value={it.id}>
            {it.name}
          </option>
        ))}
      </select>
    </label>
  );
}

/**
 * Pole-zero maps: the z-plane of every design and the s-plane of analog prototypes; for a chain, a third
 * map with each stage's poles and zeros in its own colour.
 */
export function PolesView({ items }: { items: AnalysisItem[] }) {
  const analog = useMemo(
    () => items.flatMap((it) => {
      const roots = it.spec ? safe(() => sPlaneRoots(it.spec!)) : null;
      return roots ? [{ name: it.name, color: it.color, ...roots }] : [];
    }),
    [items],
  );
  const { chains, item: chain, setChosen } = useChosenChain(items);
  const designs = useMemo(() => items.map((it) => it.design), [items]);
  const stageDesigns = useMemo(() => chain?.design.stages ?? [], [chain]);
  const zeros = useDesignZeros(designs);
  const stageZeros = useDesignZeros(stageDesigns);
  const found = (z: ZerosState) => ("zeros" in z ? z.zeros : []);
  const stageSets = stageDesigns.map((s, k) => ({
    name: `Stage ${s.stage + 1}`,
    color: STAGE_COLORS[k % STAGE_COLORS.length],
    zeros: found(stageZeros[k]),
    poles: s.poles,
    summary: stageName(chain?.spec ?? null, s.stage),
  }));
  const pending = items.filter((_, i) => "pending" in zeros[i]).map((it) => it.name);
  const failed = items.flatMap((it, i) => {
    const z = zeros[i];
    return "error" in z ? [`${it.name}: ${z.error}`] : [];
  });
  return (
    <div className="grid gap-4 sm:grid-cols-2">
      <div>
        <PoleZeroMap
          plane="z"
          label="Pole-zero map in the z-plane"
          sets={items.map((it, i) => ({ name: it.name, color: it.color, zeros: found(zeros[i]), poles: it.design.poles }))}
        />
        {pending.length > 0 && <p className="mt-1 text-xs text-slate-500" role="status">Finding the zeros of {pending.join(", ")} (long FIR filters take a few seconds)…</p>}
        {failed.map((f) => (
          <p key={f} className="mt-1 text-xs text-red-700 dark:text-red-300">Zeros not shown for {f}</p>
        ))}
      </div>
      {analog.length > 0 && <PoleZeroMap plane="s" label="Pole-zero map of the analog prototypes in the s-plane" sets={analog} />}
      {chain && (
        <div className="space-y-2 sm:col-span-2">
          <h4 className="text-sm font-medium">Poles and zeros by stage</h4>
          <FilterPicker items={chains} value={chain.id} onChange={setChosen} label="Chain" />
          <div className="grid items-start gap-4 sm:grid-cols-2">
            <PoleZeroMap plane="z" label={`Pole-zero map of the stages of ${chain.name}`} sets={stageSets} testId="pz-stages" />
            <ul className="space-y-1 text-xs" aria-label={`Stages of ${chain.name}`}>
              {stageSets.map((s) => (
                <li key={s.name} className="flex items-start gap-1.5">
                  <Swatch color={s.color} />
                  <span>
                    <span className="font-medium">{s.name}</span> {s.summary}
                  </span>
                </li>
              ))}
            </ul>
          </div>
        </div>
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

/**
 * The float64 magnitude with f32, Q31 and Q15 quantizations overlaid; stability and largest deviation per
 * format; for a chain, the headroom at each stage's output in the device's format.
 */
export function FixedView({ items, freqs, deviceFormat, view, onView }: { items: AnalysisItem[]; freqs: number[]; deviceFormat: QuantFormat } & ViewProps) {
  const [chosen, setChosen] = useState<string>("");
  const item = items.find((it) => it.id === chosen) ?? items[0];
  const result = useMemo(() => {
    if (!item) return null;
    const float = safe(() => responseCurves(null, item.design, freqs));
    const formats = fixedPreview(item.design, freqs);
    const onDevice = formats.find((f) => f.format === deviceFormat)?.quantized;
    return { float, formats, levels: onDevice ? stageLevels(item.spec, onDevice) : [] };
  }, [item, freqs, deviceFormat]);
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
      <FilterPicker items={items} value={item.id} onChange={setChosen} />
      <Chart title={`${item.name}: magnitude quantized vs float64 (dB)`} testId="fixed-point" series={series} data={[freqs, ...cols] as uPlot.AlignedData} yLabel="dB" floor={MAGNITUDE_FLOOR_DB} view={view} onView={onView} />
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
      <ArithmeticPanel design={item.design} quantized={result.formats.find((f) => f.format === deviceFormat)?.quantized ?? null} format={deviceFormat} />
      {result.levels.length > 0 && <StageHeadroomTable levels={result.levels} format={deviceFormat} />}
    </div>
  );
}

/** Each stage's output level for a full-scale input, with the stages a worst-case input can saturate flagged. */
function StageHeadroomTable({ levels, format }: { levels: StageLevel[]; format: QuantFormat }) {
  const tight = levels.filter((l) => l.mayOverflow);
  return (
    <div className="space-y-2">
      <h4 className="text-sm font-medium">Headroom after each stage ({format.toUpperCase()}, this device)</h4>
      <table className="num w-full text-xs" data-testid="stage-headroom">
        <thead className="text-left text-slate-500">
          <tr>
            <th className="py-1 font-medium">Stage</th>
            <th className="font-medium" title="Peak gain up to this stage's output: the level a full-scale sine reaches at the worst frequency">
              Full-scale sine
            </th>
            <th className="font-medium" title="Sum of |h[n]| up to this stage's output: the bound for the worst full-scale input">
              Worst-case input
            </th>
          </tr>
        </thead>
        <tbody>
          {levels.map((l) => (
            <tr key={l.stage} data-stage={l.stage} data-overflow={l.mayOverflow} className="border-t border-slate-200 dark:border-slate-800">
              <td className="py-1 font-sans">
                {l.stage + 1}. {l.summary}
              </td>
              <td>{levelDb(l.sinePeakDb)}</td>
              <td className={l.mayOverflow ? "font-semibold text-amber-700 dark:text-amber-300" : ""}>
                {levelDb(l.worstCaseDb)}
                {l.mayOverflow && <span className="ml-1 font-sans font-normal">above full scale: can saturate</span>}
              </td>
            </tr>
          ))}
        </tbody>
      </table>
      <p className="text-xs text-slate-500">
        The gain is spread over the stages so that a full-scale sine never exceeds full scale at any stage&apos;s output (0 dB). The worst-case column bounds any full-scale
        input (Σ|h[n]| up to that stage).
        {tight.length > 0 && ` Above 0 dB at stage ${tight.map((l) => l.stage + 1).join(", ")}: an input of that worst shape can saturate there, so the device would clip or wrap.`}
      </p>
    </div>
  );
}
