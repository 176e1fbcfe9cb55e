"use client";

import { useActionState } from "react";
import type { ActionState } from "@/lib/http/action-state";

/** The create action's answer: the token text is present exactly once, right after creation. */
export interface TokenCreateState extends ActionState {
  token?: string;
}

interface Props {
  create: (prev: TokenCreateState, form: FormData) => Promise<TokenCreateState>;
  /** Whether the user may create promote tokens (leads and admins). */
  canPromote: boolean;
}

/** Names a new API token, picks its scope, and shows its text once, with a copy button. */
export function TokenCreateForm({ create, canPromote }: Props) {
  const [state, action, pending] = useActionState<TokenCreateState, FormData>(create, { ok: true });
  return (
    <div className="space-y-3">
      <form action={action} className="space-y-3" data-testid="token-create-form">
        <div>
          <label htmlFor="token-name" className="label">Name (what uses it)</label>
          <input id="token-name" name="name" className="field" placeholder="e.g. firmware CI" autoComplete="off" maxLength={80} />
          {state.fieldErrors?.name && <p className="mt-1 text-xs text-fault">{state.fieldErrors.name}</p>}
        </div>
        <fieldset>
          <legend className="label">Scope</legend>
          <label className="flex items-start gap-2 text-sm">
            <input type="radio" name="scope" value="read" defaultChecked className="mt-1" />
            <span><b>read</b>: exports and reads (firmware builds)</span>
          </label>
          {canPromote && (
            <label className="mt-1 flex items-start gap-2 text-sm">
              <input type="radio" name="scope" value="promote" className="mt-1" />
              <span><b>promote</b>: also requests the promotion of approved revisions (release pipelines); every use is audited with the token&apos;s name</span>
            </label>
          )}
          {state.fieldErrors?.scope && <p className="mt-1 text-xs text-fault">{state.fieldErrors.scope}</p>}
        </fieldset>
        <button className="btn-primary" disabled={pending}>{pending ? "Creating…" : "Create token"}</button>
      </form>
      {state.message && <p role="status" className={`text-sm ${state.ok ? "text-brand-600" : "text-fault"}`}>{state.message}</p>}
      {state.token && (
        <div className="space-y-2 rounded-md border border-amber-300 bg-amber-50 p-3 text-sm dark:border-amber-700/60 dark:bg-amber-950/40" data-testid="new-token">
          <p className="font-medium">Copy this token now. It is shown only once and cannot be recovered.</p>
          <code className="num block break-all rounded bg-white px-2 py-1 text-xs dark:bg-slate-900" data-testid="new-token-value">{state.token}</code>
          <button type="button" className="btn-quiet" onClick={() => void navigator.clipboard?.writeText(state.token ?? "")}>Copy</button>
          <p className="text-xs text-slate-600 dark:text-slate-300">Send it as <code>Authorization: Bearer …</code>; the API page shows the routes that take it.</p>
        </div>
      )}
    </div>
  );
}
