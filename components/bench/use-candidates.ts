"use client";

import { useMemo, useState } from "react";
import { newCandidateId, tryDesign, type Candidate, type Designed } from "@/lib/bench/candidates";
import { seedStage } from "@/lib/bench/chain-edit";
import { cautionsFor, type Caution } from "@/lib/bench/cautions";
import { freeColorIndex } from "@/lib/bench/colors";
import { PassCache } from "@/lib/bench/pass-cache";
import { defaultSpec } from "@/lib/bench/spec-defaults";
import type { FilterSpec, QuantFormat } from "@/lib/dsp";
import type { SeedMode } from "./spectrum-panel";

interface Options {
  sampleRateHz: number;
  deviceFormat: QuantFormat;
  crossoverHz: number | null;
  /** The candidates to start with (the live bench's kept ones). */
  initial?: Candidate[];
  /** Called with each new candidate as it is added (the live bench binds its trace slot here). */
  onAdd?: (c: Candidate) => void;
  /** Called with a candidate's id as it is removed. */
  onRemove?: (id: string) => void;
}

/**
 * The candidate list shared by the live bench and the recording replay: candidates with their designs
 * and cautions, the one being edited, and adding, editing, hiding, removing and seeding stages from a peak.
 */
export function useCandidates({ sampleRateHz: fs, deviceFormat, crossoverHz, initial, onAdd, onRemove }: Options) {
  const [candidates, setCandidates] = useState<Candidate[]>(() => initial ?? []);
  const [editingId, setEditingId] = useState<string | null>(null);
  const [seedVersion, setSeedVersion] = useState(0);
  const [seedResult, setSeedResult] = useState<{ id: string; note: string | null } | null>(null);

  // Designs and cautions are kept per spec, so editing one candidate does not redo the others (a long
  // chain's quantization takes a few hundred ms).
  const [designCache] = useState(() => new PassCache<Designed>());
  const [cautionCache] = useState(() => new PassCache<Caution[]>());
  const designs = useMemo(() => {
    const out = new Map(candidates.map((c) => [c.id, designCache.get(JSON.stringify(c.spec), () => tryDesign(c.spec))]));
    designCache.endPass();
    return out;
  }, [candidates, designCache]);
  const cautions = useMemo(() => {
    const out = new Map<string, Caution[]>();
    for (const c of candidates) {
      const design = designs.get(c.id)?.design;
      if (!design) continue;
      const key = `${JSON.stringify(c.spec)}|${deviceFormat}|${crossoverHz}`;
      out.set(
        c.id,
        cautionCache.get(key, () => {
          try {
            return cautionsFor({ spec: c.spec, design, deviceFormat, crossoverHz });
          } catch (err) {
            console.error(`The cautions of ${c.id} could not be worked out`, err);
            return [];
          }
        }),
      );
    }
    cautionCache.endPass();
    return out;
  }, [candidates, designs, deviceFormat, crossoverHz, cautionCache]);

  const addCandidate = (spec?: FilterSpec) => {
    const colorIndex = freeColorIndex(candidates.map((c) => c.colorIndex));
    if (colorIndex === null) return;
    const c: Candidate = { id: newCandidateId(), colorIndex, spec: spec ?? defaultSpec("iir", fs), visible: true };
    onAdd?.(c);
    setCandidates((cs) => [...cs, c]);
    setEditingId(c.id);
  };
  const updateSpec = (id: string, spec: FilterSpec) => setCandidates((cs) => cs.map((c) => (c.id === id ? { ...c, spec } : c)));
  const removeCandidate = (id: string) => {
    onRemove?.(id);
    setCandidates((cs) => cs.filter((c) => c.id !== id));
    if (editingId === id) setEditingId(null);
  };
  const setCandidateVisible = (id: string, visible: boolean) => setCandidates((cs) => cs.map((c) => (c.id === id ? { ...c, visible } : c)));
  /** A spectrum click: a notch or low-pass stage for the candidate being edited, or a new candidate. */
  const seed = (freqHz: number, mode: SeedMode) => {
    const editing = candidates.find((c) => c.id === editingId);
    const edit = seedStage(editing?.spec ?? null, freqHz, mode, fs);
    if (!editing) return addCandidate(edit.spec);
    updateSpec(editing.id, edit.spec);
    setSeedResult({ id: editing.id, note: edit.note });
    setSeedVersion((v) => v + 1);
  };

  const editing = candidates.find((c) => c.id === editingId) ?? null;
  const editingDesign = editing ? designs.get(editing.id) : undefined;
  const seedNote = editing && seedResult?.id === editing.id ? seedResult.note : null;

  return { candidates, designs, cautions, editingId, setEditingId, editing, editingDesign, seedVersion, seedNote, addCandidate, updateSpec, removeCandidate, setCandidateVisible, seed };
}

export type CandidateList = ReturnType<typeof useCandidates>;
