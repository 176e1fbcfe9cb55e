"use client";

import { useActionState } from "react";
import type { ActionState, FormAction } from "@/lib/http/action-state";

interface Props {
  action: FormAction;
  setId: number;
  latestRevision: number;
  /** The latest revision's spec, pretty-printed, as the starting point. */
  spec: string;
}

/** Saves a new draft revision from an edited spec (JSON); the server designs and analyses it. */
export function ReviseForm({ action, setId, latestRevision, spec }: Props) {
  const [state, formAction, pending] = useActionState<ActionState, FormData>(action, { ok: true });
  return (
    <form action={formAction} className="space-y-2">
      <input type="hidden" name="setId" value={setId} />
      <input type="hidden" name="expectedLatestRevision" value={latestRevision} />
      <label htmlFor="revise-spec" className="label">Spec (JSON)</label>
      <textarea id="revise-spec" name="spec" defaultValue={spec} rows={8} className="field num text-xs" spellCheck={false} />
      <label htmlFor="revise-notes" className="label">Notes</label>
      <textarea id="revise-notes" name="notes" rows={2} className="field" placeholder="What changed and why" />
      <button className="btn-quiet" disabled={pending}>{pending ? "Designing…" : `Save as r${latestRevision + 1}`}</button>
      {state.message && (
        <p role="status" className={`text-sm ${state.ok ? "text-brand-600" : "text-fault"}`}>
          {state.message}
        </p>
      )}
    </form>
  );
}
