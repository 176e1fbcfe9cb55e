"use client";

import { useEffect, useRef, useState } from "react";
import { Segmented } from "@/components/ui/segmented";
import { chainIssues, MAX_STAGES, stageSpecOf } from "@/lib/bench/chain-edit";
import { type SpecKind } from "@/lib/bench/spec-defaults";
import { stageSummary } from "@/lib/bench/spec-text";
import type { FilterSpec } from "@/lib/dsp";
import { useReportValidity } from "./form-fields";
import { HarmonicSeriesForm } from "./harmonic-form";
import { KindSelect } from "./kind-select";
import { RequirementForm } from "./requirement-form";
import { SpecForm } from "./spec-form";
import { useChain } from "./use-chain";

const alertText = "text-xs text-red-700 dark:text-red-300";

/**
 * A filter as its ordered stages: each with its summary, move up/down, bypass and remove, one open at a
 * time with its design form; then adding a stage of any kind and a harmonic series of notches. Every
 * edit goes to onSpec at once; a design error shows beside the stage it belongs to. `resetKey` changes
 * when the spec was changed from outside (a spectrum click), so the open form starts afresh.
 */
export function StageList({
  spec,
  onSpec,
  designError,
  resetKey = 0,
  onValidity,
}: {
  spec: FilterSpec;
  onSpec: (spec: FilterSpec) => void;
  designError: string | null;
  resetKey?: number;
  /** Hears whether the open form holds a usable value (Save waits for one). */
  onValidity?: (valid: boolean) => void;
}) {
  const chain = useChain(spec, onSpec);
  const [formValid, setFormValid] = useState(true);
  useReportValidity(formValid, onValidity);
  const { stages, open } = chain;
  const issues = chainIssues(spec, designError);
  const full = stages.length >= MAX_STAGES;
  const [newKind, setNewKind] = useState<SpecKind>("biquad");
  const listRef = useRef<HTMLOListElement>(null);
  const focusAfter = useRef<string | null>(null);

  useEffect(() => {
    const target = focusAfter.current;
    focusAfter.current = null;
    if (!target) return;
    listRef.current?.querySelector<HTMLButtonElement>(`[data-control="${target}"]`)?.focus();
  }, [chain.layout]);

  const move = (i: number, to: number) => {
    // Keep the keyboard on the moved stage: the same move button, or the other one once it reaches an end.
    const atEnd = to === 0 || to === stages.length - 1;
    const control = to < i ? "up" : "down";
    focusAfter.current = `${to}-${atEnd ? (control === "up" ? "down" : "up") : control}`;
    chain.move(i, to);
  };

  return (
    <section aria-label="Stages" className="space-y-3">
      <div className="flex items-baseline gap-2">
        <h3 className="font-medium">Stages</h3>
        <span className="text-xs text-slate-500">
          run from first to last · {stages.length} of {MAX_STAGES}
        </span>
      </div>
      <ol ref={listRef} className="space-y-2">
        {stages.map((stage, i) => {
          const bypassed = stage.bypassed === true;
          const lines = issues.byStage.get(i) ?? [];
          const isOpen = open === i;
          return (
            <li key={i} aria-label={`Stage ${i + 1}`} data-stage={i} data-bypassed={bypassed} className={`rounded-md border ${lines.length ? "border-fault/60" : "border-slate-200 dark:border-slate-800"}`}>
              <div className="flex items-center gap-1 px-2 py-1.5">
                <span className="num w-5 text-center text-xs text-slate-500">{i + 1}</span>
                <button
                  type="button"
                  aria-expanded={isOpen}
                  aria-controls={`stage-${i}-form`}
                  onClick={() => chain.toggle(i)}
                  className="min-w-0 flex-1 rounded px-1 py-0.5 text-left text-sm hover:bg-slate-100 dark:hover:bg-slate-800"
                >
                  <span aria-hidden="true" className="mr-1 text-xs text-slate-400">
                    {isOpen ? "▾" : "▸"}
                  </span>
                  <span data-testid="stage-summary" className={bypassed ? "text-slate-400 line-through" : ""}>
                    {stageSummary(stage)}
                  </span>
                </button>
                <button type="button" className="btn-quiet px-1.5 py-0.5 text-xs" data-control={`${i}-up`} disabled={i === 0} onClick={() => move(i, i - 1)} aria-label={`Move stage ${i + 1} up`}>
                  ↑
                </button>
                <button type="button" className="btn-quiet px-1.5 py-0.5 text-xs" data-control={`${i}-down`} disabled={i === stages.length - 1} onClick={() => move(i, i + 1)} aria-label={`Move stage ${i + 1} down`}>
                  ↓
                </button>
                <label className="flex items-center gap-1 px-1 text-xs text-slate-600 dark:text-slate-300" title="A bypassed stage stays in the chain but does not run">
                  <input type="checkbox" checked={bypassed} onChange={(e) => chain.bypass(i, e.target.checked)} aria-label={`Bypass stage ${i + 1}`} />
                  Bypass
                </label>
                <button
                  type="button"
                  className="btn-quiet px-1.5 py-0.5 text-xs"
                  disabled={stages.length === 1}
                  title={stages.length === 1 ? "A candidate needs at least one stage" : undefined}
                  onClick={() => chain.remove(i)}
                  aria-label={`Remove stage ${i + 1}`}
                >
                  ✕
                </button>
              </div>
              {lines.map((line) => (
                <p key={line} role="alert" className={`px-3 pb-1.5 ${alertText}`}>
                  {line}
                </p>
              ))}
              {isOpen && (
                <div id={`stage-${i}-form`} className="space-y-3 border-t border-slate-200 px-3 py-3 dark:border-slate-800">
                  <KindSelect id={`stage-${i}-kind`} label={`Kind of stage ${i + 1}`} value={stage.kind} onChange={(k) => chain.changeKind(i, k)} />
                  {stage.kind === "iir" && (
                    <Segmented
                      label="How to set the order"
                      value={chain.mode}
                      onChange={chain.setMode}
                      options={[
                        { value: "order", label: "Set the order" },
                        { value: "requirement", label: "From a requirement" },
                      ]}
                    />
                  )}
                  {stage.kind === "iir" && chain.mode === "requirement" ? (
                    <RequirementForm key={`${i}-req-${chain.layout}`} sampleRateHz={spec.sampleRateHz} onValid={(s) => chain.update(i, s)} onValidity={setFormValid} />
                  ) : (
                    <SpecForm key={`${i}-${stage.kind}-${chain.layout}-${resetKey}`} initial={stageSpecOf(stage)} onValid={(s) => chain.update(i, s)} onValidity={setFormValid} />
                  )}
                  {!formValid && (
                    <p role="status" className="text-xs text-amber-800 dark:text-amber-300">
                      Not applied: the plots, the stream and Save keep the design in the summary above until this form holds valid values.
                    </p>
                  )}
                </div>
              )}
            </li>
          );
        })}
      </ol>
      {issues.chain.map((line) => (
        <p key={line} role="alert" className={alertText}>
          {line}
        </p>
      ))}
      {chain.note && (
        <p role="status" className="rounded-md bg-slate-100 px-3 py-2 text-sm dark:bg-slate-800">
          {chain.note}
        </p>
      )}
      <div className="flex items-end gap-2">
        <div className="flex-1">
          <KindSelect id="new-stage-kind" label="New stage" value={newKind} onChange={setNewKind} />
        </div>
        <button type="button" className="btn-quiet" disabled={full} onClick={() => chain.add(newKind)}>
          Add stage
        </button>
      </div>
      {full && <p className="text-xs text-slate-500">A chain holds at most {MAX_STAGES} stages: remove or change one to add another.</p>}
      <details className="rounded-md border border-slate-200 px-3 py-2 dark:border-slate-800">
        <summary className="cursor-pointer text-sm font-medium">Harmonic series of notches</summary>
        <p className="mt-1 mb-2 text-xs text-slate-500">Adds a notch stage at f0, 2·f0, 3·f0 … with one Q, as far as the {MAX_STAGES}-stage limit allows.</p>
        <HarmonicSeriesForm sampleRateHz={spec.sampleRateHz} disabled={full} onAdd={chain.harmonics} />
      </details>
    </section>
  );
}
