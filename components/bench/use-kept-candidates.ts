"use client";

import { useEffect, useRef, useState } from "react";
import type { Candidate, Designed } from "@/lib/bench/candidates";
import { errorMessage } from "@/lib/errors";
import { forgetCandidate, keepCandidate } from "./api";

/** Quiet time after the last edit before it is kept, in ms. */
const KEEP_AFTER_MS = 400;

const stateOf = (c: Candidate) => `${c.colorIndex}|${JSON.stringify(c.spec)}`;

/**
 * Keeps the bench's candidates on the server, per engineer and channel, so a reload or a new sign-in
 * finds them: a new or changed candidate is kept once its spec designs, a removed one is forgotten.
 * `candidates` at the first render are the ones already kept. Returns the last failure in plain
 * words (null once a later request succeeds).
 */
export function useKeptCandidates(channel: string, candidates: Candidate[], designs: Map<string, Designed>, enabled: boolean): string | null {
  const kept = useRef<Map<string, string> | null>(null);
  kept.current ??= new Map(candidates.map((c) => [c.id, stateOf(c)]));
  const [error, setError] = useState<string | null>(null);

  useEffect(() => {
    if (!enabled) return;
    const t = setTimeout(() => {
      const known = kept.current!;
      const live = new Set(candidates.map((c) => c.id));
      const work: Promise<unknown>[] = [];
      for (const id of [...known.keys()]) {
        if (live.has(id)) continue;
        known.delete(id);
        work.push(forgetCandidate(channel, id));
      }
      for (const c of candidates) {
        const state = stateOf(c);
        if (known.get(c.id) === state || !designs.get(c.id)?.design) continue;
        known.set(c.id, state);
        work.push(
          keepCandidate(channel, c).catch((err: unknown) => {
            known.delete(c.id); // try again with the next change
            throw err;
          }),
        );
      }
      if (!work.length) return;
      Promise.all(work).then(
        () => setError(null),
        (err: unknown) => setError(errorMessage(err)),
      );
    }, KEEP_AFTER_MS);
    return () => clearTimeout(t);
  }, [channel, candidates, designs, enabled]);
  return error;
}
