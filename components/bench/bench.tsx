"use client";

import { useQuery, type UseQueryResult } from "@tanstack/react-query";
import { useCallback, useEffect, useMemo, useRef, useState } from "react";
import { Notice } from "@/components/ui/notice";
import { candidateColor, candidateName, candidateSlot, tryDesign, type Candidate } from "@/lib/bench/candidates";
import { PRODUCTION_COLOR, RAW_COLOR } from "@/lib/bench/colors";
import { PRODUCTION_SLOT, RAW_SLOT, PRODUCTION_TRACE } from "@/lib/bench/live-store";
import { judgedLine, STRONGEST, type NoiseLineChoice } from "@/lib/bench/noise-line";
import { specSummary } from "@/lib/bench/spec-text";
import type { QuantFormat } from "@/lib/dsp";
import type { ClientMessage } from "@/lib/protocol";
import { AnalysisArea } from "./analysis-area";
import type { AnalysisItem } from "./analysis-views";
import { fetchProduction, productionQueryKey, type ProductionFilter } from "./api";
import { CandidateCards } from "./candidate-cards";
import { CandidateCautions } from "./cautions-list";
import { ComparisonTable } from "./comparison-table";
import { CandidateEditor } from "./editor-panel";
import { LivePanel, type TraceInfo } from "./live-panel";
import { NoiseLinePicker } from "./noise-line-picker";
import { SpectrumPanel } from "./spectrum-panel";
import { useCandidates } from "./use-candidates";
import { useKeptCandidates } from "./use-kept-candidates";
import { useLiveChannel } from "./use-live-channel";
import { useLatest } from "@/components/hooks/use-latest";
import { formatDateTime } from "@/lib/format/date-time";

export interface BenchChannel {
  path: string;
  name: string;
  unit: string;
  sampleRateHz: number;
  coefficientFormat: QuantFormat;
}

/** Least time between two updates of one candidate on the stream, in ms (the live trace follows within a second). */
const STREAM_UPDATE_MS = 250;

/**
 * The tuning bench of one channel: live traces and spectrum, candidates with their editor, analysis
 * views, the comparison table and saving. `canEdit` comes from the server (engineer and above); an
 * operator sees the live traces and the production filter only (the sidecar refuses the rest too).
 * `kept` are the engineer's candidates kept on this channel; changes are kept as they are made.
 */
export function Bench({
  channel,
  canEdit,
  kept,
  sidecarPort,
  wsPath,
}: {
  channel: BenchChannel;
  canEdit: boolean;
  kept: Candidate[];
  sidecarPort: number;
  wsPath: string;
}) {
  const fs = channel.sampleRateHz;
  const [showRaw, setShowRaw] = useState(true);
  const [showProduction, setShowProduction] = useState(true);
  const [noiseChoice, setNoiseChoice] = useState<NoiseLineChoice>(STRONGEST);
  const [peaksHz, setPeaksHz] = useState<number[]>([]);
  const noiseLine = judgedLine(noiseChoice, peaksHz);
  const noiseLineRef = useLatest(noiseLine.freqHz);
  const [delayAtHz, setDelayAtHz] = useState<number | null>(null);
  const [crossoverHz, setCrossoverHz] = useState<number | null>(null);
  const candidateList = useCandidates({
    sampleRateHz: fs,
    deviceFormat: channel.coefficientFormat,
    crossoverHz,
    initial: kept,
    // `store` comes from useLiveChannel below; these run on user actions, after this render has finished.
    onAdd: (c) => store.bind(c.id, candidateSlot(c)),
    onRemove: (id) => store.unbind(id),
  });
  const { candidates, designs, cautions, editingId, setEditingId, editing, addCandidate, removeCandidate, setCandidateVisible, seed } = candidateList;
  const sentRef = useRef(new Map<string, string>());
  const candidatesRef = useLatest(candidates);

  const production = useQuery({ queryKey: productionQueryKey(channel.path), queryFn: () => fetchProduction(channel.path) });

  /** Brings the sidecar's candidates in line with ours: remove + add for a changed spec (the sidecar refuses a duplicate id). */
  const sync = useCallback((send: (m: ClientMessage) => void) => {
    if (!canEdit) return;
    const sent = sentRef.current;
    const live = new Map(candidatesRef.current.map((c) => [c.id, c]));
    for (const id of [...sent.keys()]) {
      if (!live.has(id)) {
        send({ type: "candidate.remove", channel: channel.path, id });
        sent.delete(id);
      }
    }
    for (const c of live.values()) {
      const text = JSON.stringify(c.spec);
      if (sent.get(c.id) === text || tryDesign(c.spec).error) continue;
      if (sent.has(c.id)) send({ type: "candidate.remove", channel: channel.path, id: c.id });
      send({ type: "candidate.add", channel: channel.path, id: c.id, spec: c.spec });
      sent.set(c.id, text);
    }
  }, [canEdit, channel.path, candidatesRef]);

  const live = useLiveChannel({
    path: channel.path,
    sampleRateHz: fs,
    port: sidecarPort,
    wsPath,
    onOpen: (send) => {
      sentRef.current.clear();
      sync(send);
      if (canEdit) send({ type: "noise-line", channel: channel.path, freqHz: noiseLineRef.current });
    },
  });
  const { store, send } = live;
  // The kept candidates were there before any add: give them their trace slots once the store exists.
  useEffect(() => {
    for (const c of kept) store.bind(c.id, candidateSlot(c));
  }, [store, kept]);
  const keepError = useKeptCandidates(channel.path, candidates, designs, canEdit);

  useEffect(() => {
    const t = setTimeout(() => sync(send), STREAM_UPDATE_MS);
    return () => clearTimeout(t);
  }, [candidates, sync, send]);

  // The sidecar judges this connection's live metrics at the bench's noise line, so both name one frequency.
  useEffect(() => {
    if (canEdit) send({ type: "noise-line", channel: channel.path, freqHz: noiseLine.freqHz });
  }, [canEdit, send, channel.path, noiseLine.freqHz]);

  const setVisible = (id: string, visible: boolean) => {
    if (id === "raw") return setShowRaw(visible);
    if (id === PRODUCTION_TRACE) return setShowProduction(visible);
    setCandidateVisible(id, visible);
  };

  const hasProduction = Boolean(production.data);
  const traces: TraceInfo[] = [
    { id: "raw", slot: RAW_SLOT, label: "Raw", color: RAW_COLOR, visible: showRaw },
    ...(hasProduction ? [{ id: PRODUCTION_TRACE, slot: PRODUCTION_SLOT, label: "Production", color: PRODUCTION_COLOR, visible: showProduction }] : []),
    ...candidates.map((c) => ({ id: c.id, slot: candidateSlot(c), label: candidateName(c), color: candidateColor(c), visible: c.visible })),
  ];
  const items: AnalysisItem[] = useMemo(() => {
    const out: AnalysisItem[] = [];
    const p = production.data;
    if (p && showProduction) out.push({ id: PRODUCTION_TRACE, name: `Production (${p.setName} r${p.revision})`, color: PRODUCTION_COLOR, spec: p.spec, design: p.design });
    for (const c of candidates) {
      const d = designs.get(c.id);
      if (c.visible && d?.design) out.push({ id: c.id, name: candidateName(c), color: candidateColor(c), spec: c.spec, design: d.design });
    }
    return out;
  }, [production.data, showProduction, candidates, designs]);

  return (
    // While the editor is open the page makes room for it (the channel page's `has-[[data-editing]]`), the alarm strip below included.
    <div className="space-y-4" data-editing={editing ? "" : undefined}>
      {live.status.error && (
        <Notice tone="error" title="The live stream refused a request">
          {live.status.error}
        </Notice>
      )}
      {keepError && (
        <Notice tone="error" title="Your candidates could not be kept">
          {keepError} They stay on this page; the next change tries again.
        </Notice>
      )}
      <LivePanel store={store} status={live.status} traces={traces} unit={channel.unit} onToggle={setVisible} />
      <ProductionLine production={production} unit={channel.unit} />
      <SpectrumPanel
        store={store}
        traces={traces.slice(0, 1)}
        unit={channel.unit}
        title="Live spectrum"
        onSeed={canEdit ? seed : undefined}
        onPeaks={(p) => setPeaksHz((old) => (old.length === p.length && old.every((f, i) => f === p[i]) ? old : p))}
        onJudge={canEdit ? (f) => setNoiseChoice({ kind: "chosen", freqHz: f, from: "peak" }) : undefined}
        judgedHz={noiseLine.freqHz}
      />
      <CandidateCards
        cards={candidates.map((c) => ({ candidate: c, designError: designs.get(c.id)?.error ?? null, cautions: cautions.get(c.id) ?? [], metrics: live.metrics[c.id] }))}
        unit={channel.unit}
        editingId={editingId}
        canEdit={canEdit}
        onEdit={setEditingId}
        onToggle={setVisible}
        onRemove={removeCandidate}
        onAdd={() => addCandidate()}
      />
      {canEdit && candidates.length === 0 && (
        <Notice title="No candidates yet">Add a candidate to try a filter on the stream, or click a peak in the live spectrum to start from a notch.</Notice>
      )}
      <AnalysisArea
        items={items}
        sampleRateHz={fs}
        deviceFormat={channel.coefficientFormat}
        emptyText={
          canEdit
            ? "Nothing to analyse yet: add a candidate, or show one that is hidden. The production filter appears here when the channel has one."
            : "No production filter is active on this channel, so there is nothing to analyse. Engineers try candidate filters here."
        }
        spectrum={<SpectrumPanel store={store} traces={traces.filter((t) => t.visible)} unit={channel.unit} title="Spectrum of the shown traces" />}
      />
      <CandidateCautions candidates={candidates} cautions={cautions} />
      <ComparisonTable
        items={items}
        metrics={live.metrics}
        noiseLine={noiseLine}
        linePicker={<NoiseLinePicker line={noiseLine} choice={noiseChoice} sampleRateHz={fs} onChoose={setNoiseChoice} />}
        delayAtHz={delayAtHz}
        onDelayAt={setDelayAtHz}
        crossoverHz={crossoverHz}
        onCrossover={setCrossoverHz}
        emptyText={
          canEdit
            ? "No filters to compare yet. Add a candidate above; the production filter joins the table when the channel has one."
            : "No production filter is active on this channel, so there is nothing to compare."
        }
      />
      {canEdit && <CandidateEditor list={candidateList} channelPath={channel.path} channelName={channel.name} />}
    </div>
  );
}

/** Which revision runs on the device, or why we cannot tell. */
function ProductionLine({ production, unit }: { production: UseQueryResult<ProductionFilter | null>; unit: string }) {
  if (production.isPending) return <p className="text-sm text-slate-500">Looking up the production filter…</p>;
  if (production.isError) {
    return (
      <Notice tone="error" title="The production filter could not be loaded">
        {production.error.message} The live traces still work. <button type="button" className="underline" onClick={() => void production.refetch()}>Try again</button>
      </Notice>
    );
  }
  const p = production.data;
  if (!p) return <p className="text-sm text-slate-500">No production filter is active on this channel: the device sends raw samples ({unit}).</p>;
  return (
    <p className="text-sm">
      <span className="mr-1.5 inline-block h-2.5 w-2.5 rounded-full bg-production align-middle" aria-hidden="true" />
      Production: <span className="font-medium">{p.setName}</span> revision {p.revision} · {specSummary(p.spec)} · active since {formatDateTime(p.activatedAt)}
    </p>
  );
}
