"use client";

import { useState, type ReactNode } from "react";
import type { QuantFormat } from "@/lib/dsp";
import { DelayView, FixedView, PolesView, ResponseView, StepView, useFrequencyGrid, type AnalysisItem, type FrequencyView } from "./analysis-views";

const VIEWS = ["Response", "Delay", "Poles", "Step", "Spectrum", "Fixed point"] as const;
type View = (typeof VIEWS)[number];

/**
 * The analysis views, overlaid for the shown filters: one view at a time, or several pinned side by
 * side. Everything is computed in the browser from lib/dsp, so an edit re-plots at once.
 */
export function AnalysisArea({
  items,
  sampleRateHz,
  deviceFormat,
  spectrum,
  emptyText,
}: {
  items: AnalysisItem[];
  sampleRateHz: number;
  deviceFormat: QuantFormat;
  spectrum: ReactNode;
  /** What to say when there is no filter to analyse (the live spectrum still shows). */
  emptyText: string;
}) {
  const [active, setActive] = useState<View>("Response");
  const [pinned, setPinned] = useState<View[]>([]);
  const [view, setView] = useState<FrequencyView>(null);
  const freqs = useFrequencyGrid(items, sampleRateHz, view);
  const zoom = { view, onView: setView };
  const shown = pinned.includes(active) ? pinned : [...pinned, active];
  const body = (v: View) => {
    if (items.length === 0 && v !== "Spectrum") return <p className="text-sm text-slate-500">{emptyText}</p>;
    switch (v) {
      case "Response":
        return <ResponseView items={items} freqs={freqs} {...zoom} />;
      case "Delay":
        return <DelayView items={items} freqs={freqs} sampleRateHz={sampleRateHz} {...zoom} />;
      case "Poles":
        return <PolesView items={items} />;
      case "Step":
        return <StepView items={items} />;
      case "Spectrum":
        return spectrum;
      case "Fixed point":
        return <FixedView items={items} freqs={freqs} deviceFormat={deviceFormat} {...zoom} />;
    }
  };
  return (
    <section aria-label="Analysis" className="card">
      <div className="flex flex-wrap items-center gap-1 border-b border-slate-200 px-3 py-2 dark:border-slate-800" role="tablist" aria-label="Analysis views">
        {VIEWS.map((v) => (
          <span key={v} className="inline-flex items-center">
            <button
              type="button"
              role="tab"
              aria-selected={v === active}
              onClick={() => setActive(v)}
              className={`rounded-l-md px-3 py-1.5 text-sm ${v === active ? "bg-slate-800 text-white dark:bg-slate-200 dark:text-slate-900" : "text-slate-600 hover:bg-slate-100 dark:text-slate-300 dark:hover:bg-slate-800"}`}
            >
              {v}
            </button>
            <button
              type="button"
              aria-pressed={pinned.includes(v)}
              aria-label={`Pin ${v}`}
              title={pinned.includes(v) ? `Unpin ${v}` : `Pin ${v} to keep it beside the others`}
              onClick={() => setPinned((p) => (p.includes(v) ? p.filter((x) => x !== v) : [...p, v]))}
              className={`mr-1 rounded-r-md px-1.5 py-1.5 text-xs ${pinned.includes(v) ? "text-brand-600 dark:text-brand-300" : "text-slate-400 hover:text-slate-600"}`}
            >
              {pinned.includes(v) ? "●" : "○"}
            </button>
          </span>
        ))}
        <span className="ml-auto text-xs text-slate-500">○ pins a view beside the others</span>
      </div>
      <div className={`grid gap-4 p-4 ${shown.length > 1 ? "xl:grid-cols-2" : ""}`}>
        {shown.map((v) => (
          <div key={v} role="tabpanel" aria-label={v} className="min-w-0">
            {shown.length > 1 && <h3 className="mb-2 text-sm font-medium">{v}</h3>}
            {body(v)}
          </div>
        ))}
      </div>
    </section>
  );
}
