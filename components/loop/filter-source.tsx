"use client";

import { useQuery } from "@tanstack/react-query";
import { useEffect, useMemo, useState } from "react";
import { fetchProduction, fetchSets, productionQueryKey } from "@/components/bench/api";
import { StageList } from "@/components/bench/stage-list";
import { Segmented } from "@/components/ui/segmented";
import { tryDesign } from "@/lib/bench/candidates";
import { specSummary } from "@/lib/bench/spec-text";
import { filterSpecSchema, type FilterDesign, type FilterSpec } from "@/lib/dsp";
import { startingSpec } from "./defaults";
import { stateWord } from "@/lib/workflow";

/** The sensor filter the loop is checked with, or why there is none yet. */
export type PickedFilter = { design: FilterDesign; label: string } | { design: null; reason: string };

type Source = "production" | "set" | "typed";

interface RevisionDetail {
  revision: number;
  spec: FilterSpec;
  design: FilterDesign;
}

async function fetchLatestRevision(setId: string): Promise<RevisionDetail | null> {
  const res = await fetch(`/api/v1/sets/${encodeURIComponent(setId)}`, { credentials: "same-origin" });
  if (!res.ok) throw new Error(res.status === 404 ? "That set no longer exists." : `The set could not be loaded (HTTP ${res.status}).`);
  const body = (await res.json()) as { revisions: RevisionDetail[] };
  return body.revisions[0] ?? null;
}

/** A spec pasted as JSON, checked by lib/dsp's filterSpecSchema. */
function JsonSpec({ sampleRateHz, onSpec }: { sampleRateHz: number; onSpec: (spec: FilterSpec | null, error: string | null) => void }) {
  const [text, setText] = useState(() => JSON.stringify(startingSpec(sampleRateHz), null, 1));
  useEffect(() => {
    let value: unknown;
    try {
      value = JSON.parse(text);
    } catch {
      onSpec(null, "This is not valid JSON.");
      return;
    }
    const parsed = filterSpecSchema.safeParse(value);
    if (parsed.success) onSpec(parsed.data, null);
    else onSpec(null, parsed.error.issues.map((i) => `${i.path.join(".") || "(spec)"}: ${i.message}`).join("; "));
  }, [text, onSpec]);
  return (
    <div>
      <label htmlFor="loop-spec-json" className="label">
        Filter spec (JSON)
      </label>
      <textarea id="loop-spec-json" rows={8} className="field num text-xs" value={text} onChange={(e) => setText(e.target.value)} spellCheck={false} />
    </div>
  );
}

/**
 * Where the sensor filter comes from: the channel's production revision, the latest revision of a saved
 * set, or a filter typed here (its stages in the bench's editor, or JSON). Reports the chosen design (or
 * why there is none) at once.
 */
export function FilterSource({ path, sampleRateHz, onPick }: { path: string; sampleRateHz: number; onPick: (f: PickedFilter) => void }) {
  const [source, setSource] = useState<Source>("production");
  const [setId, setSetId] = useState("");
  const [typing, setTyping] = useState<"form" | "json">("form");
  const [spec, setSpec] = useState<FilterSpec>(() => startingSpec(sampleRateHz));
  const [jsonState, setJsonState] = useState<{ spec: FilterSpec | null; error: string | null }>({ spec: null, error: null });
  const typed = typing === "json" ? jsonState.spec : spec;
  const typedDesign = useMemo(() => (typed ? tryDesign(typed) : null), [typed]);

  const production = useQuery({ queryKey: productionQueryKey(path), queryFn: () => fetchProduction(path), enabled: source === "production" });
  const sets = useQuery({ queryKey: ["sets", path], queryFn: () => fetchSets(path), enabled: source === "set" });
  const revision = useQuery({ queryKey: ["set-latest", setId], queryFn: () => fetchLatestRevision(setId), enabled: source === "set" && setId !== "" });

  const onJson = useMemo(() => (s: FilterSpec | null, error: string | null) => setJsonState({ spec: s, error }), []);

  const picked: PickedFilter = useMemo(() => {
    if (source === "production") {
      if (production.isPending) return { design: null, reason: "Loading the production filter…" };
      if (production.isError) return { design: null, reason: `The production filter could not be loaded: ${production.error.message}` };
      if (!production.data) return { design: null, reason: "Nothing is active on this channel yet. Pick a saved set or type a filter." };
      return { design: production.data.design, label: `Production: ${production.data.setName} r${production.data.revision}` };
    }
    if (source === "set") {
      if (setId === "") return { design: null, reason: "Pick a saved set." };
      if (revision.isPending) return { design: null, reason: "Loading the set's latest revision…" };
      if (revision.isError) return { design: null, reason: revision.error.message };
      if (!revision.data) return { design: null, reason: "That set has no revision yet." };
      const name = sets.data?.find((s) => String(s.id) === setId)?.name ?? "set";
      return { design: revision.data.design, label: `${name} r${revision.data.revision} · ${specSummary(revision.data.spec)}` };
    }
    if (!typed || !typedDesign) return { design: null, reason: `The JSON spec is refused: ${jsonState.error ?? "empty"}` };
    return typedDesign.design ? { design: typedDesign.design, label: `Typed: ${specSummary(typed)}` } : { design: null, reason: `The design failed: ${typedDesign.error}` };
  }, [source, production.isPending, production.isError, production.error, production.data, setId, revision.isPending, revision.isError, revision.error, revision.data, sets.data, typed, typedDesign, jsonState.error]);

  useEffect(() => onPick(picked), [picked, onPick]);

  return (
    <section className="card space-y-3 p-4" aria-label="Sensor filter">
      <h2 className="font-medium">Sensor filter F(z)</h2>
      <Segmented
        label="Filter source"
        value={source}
        onChange={setSource}
        options={[
          { value: "production", label: "Production filter" },
          { value: "set", label: "Saved set" },
          { value: "typed", label: "Type a filter" },
        ]}
      />
      {source === "set" && (
        <div>
          <label htmlFor="loop-set" className="label">
            Coefficient set (latest revision)
          </label>
          <select id="loop-set" className="field" value={setId} onChange={(e) => setSetId(e.target.value)}>
            <option value="">{sets.isPending ? "Loading sets…" : sets.data?.length ? "Pick a set" : "No sets for this channel"}</option>
            {sets.data?.map((s) => (
              <option key={String(s.id)} value={String(s.id)}>
                {s.name} (r{s.latestRevision}, {stateWord(s.status)})
              </option>
            ))}
          </select>
          {sets.isError && <p className="mt-1 text-xs text-red-700 dark:text-red-300">The sets could not be loaded: {sets.error.message}</p>}
        </div>
      )}
      {source === "typed" && (
        <div className="space-y-3">
          <Segmented
            label="How to type the filter"
            value={typing}
            onChange={setTyping}
            options={[
              { value: "form", label: "Form" },
              { value: "json", label: "Paste JSON" },
            ]}
          />
          {typing === "form" ? (
            <StageList spec={spec} onSpec={setSpec} designError={typedDesign?.error ?? null} />
          ) : (
            <JsonSpec sampleRateHz={sampleRateHz} onSpec={onJson} />
          )}
        </div>
      )}
      <p className="text-sm text-slate-600 dark:text-slate-300" data-testid="loop-filter-status">
        {picked.design ? picked.label : picked.reason}
      </p>
    </section>
  );
}
