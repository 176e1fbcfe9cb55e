"use client";

import { useMemo, useState } from "react";
import { PolesView, ResponseView, useFrequencyGrid, type AnalysisItem, type FrequencyView } from "@/components/bench/analysis-views";
import { PRODUCTION_COLOR } from "@/lib/bench/colors";
import type { FilterDesign, FilterSpec } from "@/lib/dsp";

/**
 * A revision's response (magnitude and phase) and pole-zero map, drawn with the bench's own views.
 * Open at once where a decision is due; otherwise behind a button, so a long set page stays light.
 */
export function RevisionCharts({ name, spec, design, open: initiallyOpen }: { name: string; spec: FilterSpec; design: FilterDesign; open: boolean }) {
  const [open, setOpen] = useState(initiallyOpen);
  const [view, setView] = useState<FrequencyView>(null);
  const items = useMemo<AnalysisItem[]>(() => [{ id: "revision", name, color: PRODUCTION_COLOR, spec, design }], [name, spec, design]);
  const freqs = useFrequencyGrid(items, design.sampleRateHz, view);
  return (
    <section className="space-y-3" aria-label={`Charts of ${name}`}>
      <button type="button" className="btn-quiet py-1 text-xs" aria-expanded={open} onClick={() => setOpen(!open)}>
        {open ? "Hide the response and pole-zero map" : "Show the response and pole-zero map"}
      </button>
      {open && (
        <>
          <ResponseView items={items} freqs={freqs} view={view} onView={setView} />
          <PolesView items={items} />
        </>
      )}
    </section>
  );
}
