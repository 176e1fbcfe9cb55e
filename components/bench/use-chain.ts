"use client";

import { useState } from "react";
import {
  addHarmonicNotches,
  addStage,
  moveStage,
  removeStage,
  replaceStage,
  setBypassed,
  type ChainEdit,
  type HarmonicSeries,
} from "@/lib/bench/chain-edit";
import { defaultSpec, type SpecKind } from "@/lib/bench/spec-defaults";
import { specStages, type FilterSpec, type StageSpec } from "@/lib/dsp";

export type OrderMode = "order" | "requirement";

/**
 * The chain being edited: its stages, the one whose form is open, and every edit (add, change, move,
 * bypass, remove, harmonic notches), each handed to onSpec as the candidate's new spec. `layout` changes
 * whenever stages are added, moved or removed, so the open form starts again from the spec.
 */
export function useChain(spec: FilterSpec, onSpec: (spec: FilterSpec) => void) {
  const fs = spec.sampleRateHz;
  const [open, setOpen] = useState<number | null>(0);
  const [mode, setMode] = useState<OrderMode>("order");
  const [layout, setLayout] = useState(0);
  const [note, setNote] = useState<string | null>(null);
  const stages = specStages(spec);

  const apply = (edit: ChainEdit, relayout: boolean) => {
    onSpec(edit.spec);
    setNote(edit.note);
    if (relayout) setLayout((v) => v + 1);
  };
  const openStage = (i: number | null) => {
    setOpen(i);
    setMode("order");
  };

  return {
    stages,
    open,
    mode,
    setMode,
    layout,
    note,
    toggle: (i: number) => openStage(open === i ? null : i),
    add: (kind: SpecKind) => {
      const edit = addStage(spec, defaultSpec(kind, fs));
      apply(edit, true);
      if (edit.stage !== null) openStage(edit.stage);
    },
    update: (i: number, stage: StageSpec) => apply(replaceStage(spec, i, stage), false),
    changeKind: (i: number, kind: SpecKind) => {
      apply(replaceStage(spec, i, defaultSpec(kind, fs)), true);
      setMode("order");
    },
    move: (i: number, to: number) => {
      apply(moveStage(spec, i, to), true);
      if (open === i) setOpen(to);
      else if (open === to) setOpen(i);
    },
    bypass: (i: number, bypassed: boolean) => apply(setBypassed(spec, i, bypassed), false),
    remove: (i: number) => {
      const edit = removeStage(spec, i);
      apply(edit, true);
      if (edit.spec === spec || open === null) return;
      if (open === i) setOpen(null);
      else if (open > i) setOpen(open - 1);
    },
    harmonics: (series: HarmonicSeries) => apply(addHarmonicNotches(spec, series), true),
  };
}

export type ChainEditor = ReturnType<typeof useChain>;
