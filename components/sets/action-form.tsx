"use client";

import { useActionState, type ReactNode } from "react";
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
}

/** One server action behind one button, with the server's answer shown under it. */
export function ActionForm({ action, fields, label, tone = "quiet", children, testId }: Props) {
  const [state, formAction, pending] = useActionState<ActionState, FormData>(action, { ok: true });
  return (
    <form action={formAction} className="space-y-1" data-testid={testId}>
      {Object.entries(fields).map(([name, value]) => (
        <input key={name} type="hidden" name={name} value={value} />
      ))}
      {children}
      <button className={tone === "primary" ? "btn-primary" : "btn-quiet"} disabled={pending}>
        {pending ? "Working…" : label}
      </button>
      {state.message && (
        <p role="status" className={`text-xs ${state.ok ? "text-brand-600" : "text-fault"}`}>
          {state.message}
        </p>
      )}
    </form>
  );
}
