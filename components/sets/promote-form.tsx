"use client";

import { useActionState } from "react";
import type { ActionState, FormAction } from "@/lib/http/action-state";
import { SafetyCaution } from "./safety-caution";

interface Props {
  action: FormAction;
  revisionId: number;
  revision: number;
  /** Channels of the revision's sample rate, with what runs there now. */
  channels: { path: string; format: string; active: string | null; pending: boolean }[];
  defaultChannel: string;
  /** Whether this form shows the cautions; a page with several promotable revisions shows them once, with the first. */
  showCaution: boolean;
}

/** Promotion of an approved revision to channels of the same sample rate, behind the cautions. */
export function PromoteForm({ action, revisionId, revision, channels, defaultChannel, showCaution }: Props) {
  const [state, formAction, pending] = useActionState<ActionState, FormData>(action, { ok: true });
  // "Waiting for the device" holds only while a deployment waits; once none does, the table below tells what the device did.
  const answered = state.ok && !channels.some((c) => c.pending);
  const message = answered && state.message ? "The device has answered: the deployments on this page show what runs now." : state.message;
  return (
    <form action={formAction} className="space-y-3" data-testid="promote-form">
      <input type="hidden" name="revisionId" value={revisionId} />
      <fieldset>
        <legend className="label">Promote r{revision} to</legend>
        <ul className="space-y-1 text-sm">
          {channels.map((c) => (
            <li key={c.path}>
              <label className="flex items-center gap-2">
                <input type="checkbox" name="channels" value={c.path} defaultChecked={c.path === defaultChannel} disabled={c.pending} />
                <span className="num text-xs">{c.path}</span>
                <span className="text-xs text-slate-500">
                  {c.format} · {c.pending ? "a deployment is pending" : c.active ? `runs ${c.active}` : "no production filter"}
                </span>
              </label>
            </li>
          ))}
        </ul>
      </fieldset>
      {showCaution ? <SafetyCaution /> : <p className="text-sm text-slate-500">The cautions under &ldquo;Before you promote&rdquo; above apply here too.</p>}
      <label className="flex items-start gap-2 text-sm">
        <input type="checkbox" name="confirm" value="yes" className="mt-1" />
        <span>I have read the cautions, and this revision went through our review for these channels.</span>
      </label>
      <button className="btn-primary" disabled={pending}>{pending ? "Sending…" : "Promote"}</button>
      {message && (
        <p role="status" className={`text-sm ${state.ok ? "text-brand-600" : "text-fault"}`}>
          {message}
        </p>
      )}
    </form>
  );
}
