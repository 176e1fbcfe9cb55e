"use client";

import { useQuery } from "@tanstack/react-query";
import { useMemo, useState } from "react";
import { AnalysisArea } from "@/components/bench/analysis-area";
import type { AnalysisItem } from "@/components/bench/analysis-views";
import { CandidateCards } from "@/components/bench/candidate-cards";
import { CandidateCautions } from "@/components/bench/cautions-list";
import { ComparisonTable } from "@/components/bench/comparison-table";
import { NoiseLinePicker } from "@/components/bench/noise-line-picker";
import { judgedLine, STRONGEST, type NoiseLineChoice } from "@/lib/bench/noise-line";
import { CandidateEditor } from "@/components/bench/editor-panel";
import { useCandidates } from "@/components/bench/use-candidates";
import { Notice } from "@/components/ui/notice";
import { candidateColor, candidateName } from "@/lib/bench/candidates";
import { RAW_COLOR } from "@/lib/bench/colors";
import { PassCache } from "@/lib/bench/pass-cache";
import { liveSpectrum } from "@/lib/bench/spectrum";
import type { QuantFormat } from "@/lib/dsp";
import type { CandidateMetrics } from "@/lib/protocol";
import { longestRun, replayThrough } from "@/lib/recordings/replay";
import { fetchSamples } from "./api";
import { ReplaySpectrum, type TraceSpectrum } from "./replay-spectrum";
import { ReplayTraceChart, type ReplayTrace } from "./replay-trace";
import { TryOnBench } from "./try-on-bench";

export interface ReplayRecording {
  id: number;
  channelPath: string;
  channelName: string;
  unit: string;
  sampleRateHz: number;
  coefficientFormat: QuantFormat;
}

/** RMS of raw − output over samples present in both, in the channel's unit. */
function removedRms(raw: Float64Array, out: Float64Array): number | null {
  let sum = 0;
  let count = 0;
  for (let i = 0; i < raw.length; i++) {
    const d = raw[i] - out[i];
    if (Number.isFinite(d)) {
      sum += d * d;
      count++;
    }
  }
  return count ? Math.sqrt(sum / count) : null;
}

function spectrumOf(x: Float64Array, run: { from: number; to: number }, fs: number, peaks: number) {
  return liveSpectrum(x.subarray(run.from, run.to), fs, peaks);
}

/**
 * Replay of one recording: its whole trace and spectrum, and (for engineers) up to six candidates from
 * the bench's editor run offline through the samples with filterSignal (initial 'step'), overlaid,
 * with the bench's analysis views, cautions and comparison table.
 */
export function RecordingReplay({ recording, canEdit }: { recording: ReplayRecording; canEdit: boolean }) {
  const fs = recording.sampleRateHz;
  const samples = useQuery({ queryKey: ["recording-samples", recording.id], queryFn: () => fetchSamples(recording.id), staleTime: Infinity });
  const [showRaw, setShowRaw] = useState(true);
  const [delayAtHz, setDelayAtHz] = useState<number | null>(null);
  const [crossoverHz, setCrossoverHz] = useState<number | null>(null);
  const [noiseChoice, setNoiseChoice] = useState<NoiseLineChoice>(STRONGEST);
  const candidateList = useCandidates({ sampleRateHz: fs, deviceFormat: recording.coefficientFormat, crossoverHz });
  const { candidates, designs, cautions, editingId, setEditingId, editing, addCandidate, removeCandidate, setCandidateVisible, seed } = candidateList;
  const [outputCache] = useState(() => new PassCache<Float64Array>());

  const raw = samples.data ?? null;
  const run = useMemo(() => (raw ? longestRun(raw) : { from: 0, to: 0 }), [raw]);
  const outputs = useMemo(() => {
    const out = new Map<string, Float64Array>();
    if (!raw) return out;
    for (const c of candidates) {
      const d = designs.get(c.id);
      if (!d?.design) continue;
      const design = d.design;
      out.set(c.id, outputCache.get(`${c.id}|${JSON.stringify(c.spec)}`, () => replayThrough(design, raw)));
    }
    outputCache.endPass();
    return out;
  }, [raw, candidates, designs, outputCache]);

  const traces: ReplayTrace[] = useMemo(() => {
    if (!raw) return [];
    const list: ReplayTrace[] = [{ id: "raw", label: "Raw", color: RAW_COLOR, samples: raw, visible: showRaw }];
    for (const c of candidates) {
      const y = outputs.get(c.id);
      if (y) list.push({ id: c.id, label: candidateName(c), color: candidateColor(c), samples: y, visible: c.visible });
    }
    return list;
  }, [raw, showRaw, candidates, outputs]);
  const spectra: TraceSpectrum[] = useMemo(() => traces.filter((t, i) => i === 0 || t.visible).map((t, i) => ({ trace: t, spectrum: spectrumOf(t.samples, run, fs, i === 0 ? 5 : 0) })), [traces, run, fs]);
  const noiseLine = judgedLine(noiseChoice, spectra[0]?.spectrum?.peaks.map((p) => p.freqHz) ?? []);
  const noiseLineHz = noiseLine.freqHz;
  const metrics = useMemo(() => {
    const m: Record<string, CandidateMetrics> = {};
    if (!raw) return m;
    for (const [id, y] of outputs) m[id] = { removedRms: removedRms(raw, y), lagMs: null, measuredAttenuationDb: null, predictedAttenuationDb: null, noiseLineHz };
    return m;
  }, [raw, outputs, noiseLineHz]);

  const setVisible = (id: string, visible: boolean) => {
    if (id === "raw") return setShowRaw(visible);
    setCandidateVisible(id, visible);
  };

  const items: AnalysisItem[] = candidates.flatMap((c) => {
    const d = designs.get(c.id);
    return c.visible && d?.design ? [{ id: c.id, name: candidateName(c), color: candidateColor(c), spec: c.spec, design: d.design }] : [];
  });

  if (samples.isPending) return <Notice title="Loading the samples…">Large recordings take a few seconds to arrive.</Notice>;
  if (samples.isError) {
    return (
      <Notice tone="error" title="The samples could not be loaded">
        {samples.error.message}{" "}
        <button type="button" className="underline" onClick={() => void samples.refetch()}>
          Try again
        </button>
      </Notice>
    );
  }
  const spectrumPanel = (
    <ReplaySpectrum
      spectra={spectra}
      unit={recording.unit}
      stretchSeconds={(run.to - run.from) / fs}
      onSeed={canEdit ? seed : undefined}
      onJudge={canEdit ? (f) => setNoiseChoice({ kind: "chosen", freqHz: f, from: "peak" }) : undefined}
      judgedHz={noiseLineHz}
    />
  );
  return (
    <div className={`space-y-4 ${editing ? "lg:pr-[29rem]" : ""}`}>
      <TryOnBench channelPath={recording.channelPath} candidates={canEdit ? candidates : []} designs={designs} />
      <ReplayTraceChart traces={traces} sampleRateHz={fs} unit={recording.unit} onToggle={canEdit ? setVisible : undefined} />
      {spectrumPanel}
      {canEdit && (
        <>
          <CandidateCards
            cards={candidates.map((c) => ({ candidate: c, designError: designs.get(c.id)?.error ?? null, cautions: cautions.get(c.id) ?? [], metrics: metrics[c.id] }))}
            unit={recording.unit}
            editingId={editingId}
            canEdit
            onEdit={setEditingId}
            onToggle={setVisible}
            onRemove={removeCandidate}
            onAdd={() => addCandidate()}
          />
          {candidates.length === 0 && <Notice title="No candidates yet">Add a candidate to run a filter through the whole recording, or pick a peak in the spectrum to start from a notch.</Notice>}
          <AnalysisArea items={items} sampleRateHz={fs} deviceFormat={recording.coefficientFormat} emptyText="Nothing to analyse yet: add a candidate, or show one that is hidden." spectrum={spectrumPanel} />
          <CandidateCautions candidates={candidates} cautions={cautions} />
          <ComparisonTable
            items={items}
            metrics={{}}
            noiseLine={noiseLine}
            linePicker={<NoiseLinePicker line={noiseLine} choice={noiseChoice} sampleRateHz={fs} onChoose={setNoiseChoice} />}
            delayAtHz={delayAtHz}
            onDelayAt={setDelayAtHz}
            crossoverHz={crossoverHz}
            onCrossover={setCrossoverHz}
            emptyText="No filters to compare yet. Add a candidate above."
          />
          <CandidateEditor list={candidateList} channelPath={recording.channelPath} channelName={recording.channelName} />
        </>
      )}
    </div>
  );
}
