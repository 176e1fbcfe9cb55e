"use client";

import { useActionState } from "react";
import type { ActionState, FormAction } from "@/lib/http/action-state";
import { ROLES } from "@/lib/auth/roles";

const FIELDS = [
  { name: "email", label: "E-mail", type: "email" },
  { name: "displayName", label: "Display name", type: "text" },
  { name: "password", label: "Initial password", type: "password" },
] as const;

export function CreateUserForm({ submit }: { submit: FormAction }) {
  const [state, action, pending] = useActionState<ActionState, FormData>(submit, { ok: true });
  return (
    <form action={action} className="space-y-3">
      {FIELDS.map((f) => (
        <div key={f.name}>
          <label htmlFor={`new-${f.name}`} className="label">{f.label}</label>
          <input id={`new-${f.name}`} name={f.name} type={f.type} className="field" autoComplete="off" />
          {state.fieldErrors?.[f.name] && <p className="mt-1 text-xs text-fault">{state.fieldErrors[f.name]}</p>}
        </div>
      ))}
      <div>
        <label htmlFor="new-role" className="label">Role</label>
        <select id="new-role" name="role" className="field" defaultValue="operator">
          {ROLES.map((r) => <option key={r} value={r}>{r}</option>)}
        </select>
      </div>
      {state.message && <p role="status" className={`text-sm ${state.ok ? "text-brand-600" : "text-fault"}`}>{state.message}</p>}
      <button className="btn-primary" disabled={pending}>Create user</button>
    </form>
  );
}
