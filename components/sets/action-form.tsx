"use client";

import { useActionState, useState, type ReactNode } from "react";
import type { ActionState, FormAction } from "@/lib/http/action-state";

interface Props {
  action: FormAction;
  /** Hidden fields the server needs (ids and the version the page was rendered with). */
  fields: Record<string, string | number>;
  label: string;
  tone?: "primary" | "quiet";
  /** Extra inputs (a comment box) rendered before the button. */
  children?: ReactNode;
  testId?: string;
  /** Ask this question first; the action runs only after "Yes". */
  confirm?: string;
}

/**
 * One server action behind one button, with the server's answer shown under it. With `confirm`, the
 * button first asks the question and offers "Yes" and "Cancel"; only "Yes" submits.
 */
export function ActionForm({ action, fields, label, tone = "quiet", children, testId, confirm }: Props) {
  const [state, formAction, pending] = useActionState<ActionState, FormData>(action, { ok: true });
  const [asking, setAsking] = useState(false);
  const buttonClass = tone === "primary" ? "btn-primary" : "btn-quiet";
  return (
    <form action={(data) => { setAsking(false); formAction(data); }} className="space-y-1" data-testid={testId}>
      {Object.entries(fields).map(([name, value]) => (
        <input key={name} type="hidden" name={name} value={value} />
      ))}
      {children}
      {confirm && !pending && asking ? (
        <div role="alertdialog" aria-label={label} className="space-y-1 rounded border border-amber-400 p-2 text-sm">
          <p>{confirm}</p>
          <div className="flex gap-2">
            <button className={buttonClass} autoFocus>
              Yes, {label.charAt(0).toLowerCase() + label.slice(1)}
            </button>
            <button type="button" className="btn-quiet" onClick={() => setAsking(false)}>
              Cancel
            </button>
          </div>
        </div>
      ) : confirm && !pending ? (
        <button type="button" className={buttonClass} onClick={() => setAsking(true)}>
          {label}
        </button>
      ) : (
        <button className={buttonClass} disabled={pending}>
          {pending ? "Working…" : label}
        </button>
      )}
      {state.message && (
        <p role="status" className={`text-xs ${state.ok ? "text-brand-600" : "text-fault"}`}>
          {state.message}
        </p>
      )}
    </form>
  );
}
