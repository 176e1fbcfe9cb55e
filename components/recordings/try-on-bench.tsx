"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";
import { keepCandidate } from "@/components/bench/api";
import type { Candidate, Designed } from "@/lib/bench/candidates";
import { errorMessage } from "@/lib/errors";
import { countOf } from "@/lib/format/plural";

/**
 * "Try on the live bench": keeps the replay's candidates that design on the engineer's bench of the
 * channel (the bench opens with them), then opens the bench. Without candidates it only opens it.
 */
export function TryOnBench({ channelPath, candidates, designs }: { channelPath: string; candidates: Candidate[]; designs: Map<string, Designed> }) {
  const router = useRouter();
  const [state, setState] = useState<{ busy: boolean; error: string | null }>({ busy: false, error: null });
  const carried = candidates.filter((c) => designs.get(c.id)?.design);

  async function go() {
    setState({ busy: true, error: null });
    try {
      for (const c of carried) await keepCandidate(channelPath, c);
      router.push(`/channels/${channelPath}`);
    } catch (err) {
      setState({ busy: false, error: `The candidates could not be carried over: ${errorMessage(err)}` });
    }
  }

  return (
    <div className="flex flex-wrap items-center justify-end gap-3">
      {state.error && (
        <p role="alert" className="text-sm text-red-600 dark:text-red-400">
          {state.error}
        </p>
      )}
      <button type="button" className="btn-quiet py-1 text-sm" disabled={state.busy} onClick={() => void go()}>
        {state.busy ? "Opening the bench…" : carried.length ? `Try on the live bench (${countOf(carried.length, "candidate")})` : "Try on the live bench"}
      </button>
    </div>
  );
}
