"use client";

import { useMemo, type ReactNode } from "react";
import { Swatch } from "@/components/ui/swatch";
import { onOrOutsideUnitCircle } from "@/lib/bench/cautions";
import { candidateFigures, type CandidateFigures } from "@/lib/bench/figures";
import { hz, withUnit } from "@/lib/bench/format";
import type { JudgedLine } from "@/lib/bench/noise-line";
import { activeStages, stability } from "@/lib/dsp";
import type { CandidateMetrics } from "@/lib/protocol";
import type { AnalysisItem } from "./analysis-views";
import { countOf } from "@/lib/format/plural";

/** The row's figures, or a plain sentence in their place (the cause of a failure goes to the console). */
function figuresOf(item: AnalysisItem, noiseLineHz: number | null, delayAtHz: number | null): CandidateFigures | string {
  if (onOrOutsideUnitCircle(stability(item.design).maxPoleRadius)) return UNSTABLE_ROW;
  try {
    return candidateFigures(item.design, { noiseLineHz, delayAtHz });
  } catch (err) {
    console.error(`The figures of ${item.id} could not be worked out`, err);
    return "The figures of this design could not be worked out.";
  }
}

/** What an unstable candidate's row says instead of figures. */
export const UNSTABLE_ROW = "Unstable or marginal: a pole lies on or outside the unit circle, so its output does not settle and has no attenuation or delay to compare.";

const KIND: Record<string, string> = {
  iir: "IIR",
  biquad: "Biquad",
  fir: "FIR",
  "fir-equiripple": "FIR equiripple",
  "fir-arbitrary": "FIR arbitrary",
  notch: "Notch (bandwidth Q)",
  comb: "Comb",
  "moving-average": "Moving avg.",
  differentiator: "Differentiator",
  ema: "EMA",
  analog: "Analog → z",
  coefficients: "Pasted",
  chain: "Chain",
};

/** Sections and taps of a design, e.g. "1 section", "101 taps", "3 sections + 101 taps" for a chain. */
const sizeOf = (f: CandidateFigures) => [f.sections !== null ? countOf(f.sections, "section") : null, f.taps !== null ? countOf(f.taps, "tap") : null].filter(Boolean).join(" + ");

function NumberInput({ id, label, value, onChange }: { id: string; label: string; value: number | null; onChange: (v: number | null) => void }) {
  return (
    <label htmlFor={id} className="flex items-center gap-1.5 text-sm">
      <span className="text-slate-500">{label}</span>
      <input
        id={id}
        type="number"
        min={0}
        step="any"
        className="field num w-24 py-1"
        value={value ?? ""}
        onChange={(e) => onChange(e.target.value === "" ? null : Number(e.target.value))}
      />
      <span className="text-slate-500">Hz</span>
    </label>
  );
}

/** The noise line the live metrics were judged at (the first row's that has one), or null. */
function liveLineOf(items: AnalysisItem[], metrics: Record<string, CandidateMetrics>): number | null {
  for (const it of items) {
    const f = metrics[it.id]?.noiseLineHz;
    if (typeof f === "number") return f;
  }
  return null;
}

/**
 * The closing comparison: per filter its kind and order, sections, −3 dB points, attenuation at the
 * noise line being judged, group delay at DC and at a chosen frequency, step overshoot and settling,
 * largest pole radius, and the sidecar's live metrics. Every number carries its unit; each attenuation
 * column names the frequency it is judged at. `linePicker` shows and changes the noise line.
 */
export function ComparisonTable({
  items,
  metrics,
  noiseLine,
  linePicker,
  delayAtHz,
  onDelayAt,
  crossoverHz,
  onCrossover,
  emptyText,
}: {
  items: AnalysisItem[];
  metrics: Record<string, CandidateMetrics>;
  noiseLine: JudgedLine;
  linePicker?: ReactNode;
  delayAtHz: number | null;
  onDelayAt: (hz: number | null) => void;
  crossoverHz: number | null;
  onCrossover: (hz: number | null) => void;
  emptyText: string;
}) {
  const noiseLineHz = noiseLine.freqHz;
  const rows = useMemo(() => items.map((it) => ({ it, f: figuresOf(it, noiseLineHz, delayAtHz) })), [items, noiseLineHz, delayAtHz]);
  const liveLineHz = liveLineOf(items, metrics);
  const hasLive = items.some((it) => metrics[it.id]);
  const th = "px-2 py-1.5 text-left font-medium whitespace-nowrap";
  const td = "px-2 py-1.5 whitespace-nowrap";
  return (
    <section aria-label="Comparison" className="card overflow-hidden">
      <div className="flex flex-wrap items-center gap-4 border-b border-slate-200 px-4 py-2.5 dark:border-slate-800">
        <h2 className="font-medium">Comparison</h2>
        <NumberInput id="delay-at" label="Group delay at" value={delayAtHz} onChange={onDelayAt} />
        <NumberInput id="crossover" label="Loop crossover" value={crossoverHz} onChange={onCrossover} />
        {linePicker ?? (
          <span className="text-sm">
            <span className="text-slate-500">Noise line judged: </span>
            <span className="num">{noiseLine.label}</span>
          </span>
        )}
      </div>
      {items.length === 0 ? (
        <p className="px-4 py-4 text-sm text-slate-500">{emptyText}</p>
      ) : (
        <div className="max-w-full overflow-x-auto">
          <table className="num w-full text-xs" data-testid="comparison-table">
            <thead className="bg-slate-50 text-slate-500 dark:bg-slate-900/60">
              <tr>
                <th className={th}>Filter</th>
                <th className={th}>Kind · order</th>
                <th className={th}>Sections / taps</th>
                <th className={th}>−3 dB</th>
                <th className={th}>Atten. at {noiseLineHz === null ? "line" : hz(noiseLineHz, 4)}</th>
                <th className={th}>Delay at DC</th>
                <th className={th}>Delay at {delayAtHz === null ? "f" : hz(delayAtHz, 3)}</th>
                <th className={th}>Overshoot</th>
                <th className={th}>Settling 2 %</th>
                <th className={th}>Max |pole|</th>
                <th className={th}>Live lag</th>
                <th className={th}>
                  Live atten. at {liveLineHz === null ? "line" : hz(liveLineHz, 4)}{" "}
                  <span className="block font-normal">(measured / predicted)</span>
                </th>
              </tr>
            </thead>
            <tbody>
              {rows.map(({ it, f }) => {
                const m = metrics[it.id];
                if (typeof f === "string") {
                  return (
                    <tr key={it.id} className="border-t border-slate-200 dark:border-slate-800" data-row={it.id}>
                      <td className={`${td} font-sans`}>{it.name}</td>
                      <td colSpan={11} className={`${td} font-sans text-red-700 dark:text-red-300`}>
                        {f}
                      </td>
                    </tr>
                  );
                }
                return (
                  <tr key={it.id} className="border-t border-slate-200 dark:border-slate-800" data-row={it.id}>
                    <td className={`${td} font-sans`}>
                      <span className="flex items-center gap-1.5">
                        <Swatch color={it.color} /> {it.name}
                      </span>
                    </td>
                    <td className={td}>
                      {it.spec ? KIND[it.spec.kind] : "—"}
                      {it.spec?.kind === "chain" && ` of ${activeStages(it.spec).length}`} · {f.order}
                    </td>
                    <td className={td}>{sizeOf(f)}</td>
                    <td className={td}>{f.cutoffHz.length ? f.cutoffHz.map((c) => hz(c, 4)).join(", ") : "—"}</td>
                    <td className={td}>{withUnit(f.attenuationAtNoiseDb, "dB")}</td>
                    <td className={td}>
                      {withUnit(f.delayDcMs, "ms")} <span className="text-slate-500">({withUnit(f.delayDcSamples, "samples")})</span>
                    </td>
                    <td className={td}>
                      {f.delayAtMs === null ? "—" : <>{withUnit(f.delayAtMs, "ms")} <span className="text-slate-500">({withUnit(f.delayAtSamples, "samples")})</span></>}
                    </td>
                    <td className={td}>{withUnit(f.overshootPercent, "%")}</td>
                    <td className={td}>{withUnit(f.settlingTimeS === null ? null : f.settlingTimeS * 1000, "ms")}</td>
                    <td className={`${td} ${f.stable ? "" : "text-red-700 dark:text-red-300"}`}>{withUnit(f.maxPoleRadius, "", 4)}</td>
                    <td className={td}>{withUnit(m?.lagMs, "ms")}</td>
                    <td className={td}>
                      {withUnit(m?.measuredAttenuationDb, "dB")} / {withUnit(m?.predictedAttenuationDb, "dB")}
                      {typeof m?.noiseLineHz === "number" && hz(m.noiseLineHz, 4) !== hz(liveLineHz, 4) && <span className="text-slate-500"> at {hz(m.noiseLineHz, 4)}</span>}
                    </td>
                  </tr>
                );
              })}
            </tbody>
          </table>
          {hasLive && (
            <p className="px-4 py-2 font-sans text-xs text-slate-500">
              The live predicted attenuation is the design&apos;s figure at the line the sidecar judged, the same figure as the table&apos;s column when both name the same frequency
              (the sidecar follows the bench&apos;s line within about a second). The measured one is the ratio of raw to filtered power in one Welch bin around the line (about 1/1024 of the sample rate
              wide), so a notch narrower than a bin measures shallower than predicted.
            </p>
          )}
        </div>
      )}
    </section>
  );
}
