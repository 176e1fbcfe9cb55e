"use client";

import { useActionState } from "react";
import type { ActionState, FormAction } from "@/lib/http/action-state";
import { ROLES, type Role } from "@/lib/auth/roles";

interface Props {
  user: { id: number; email: string; name: string; role: Role; disabled: boolean };
  self: boolean;
  submit: FormAction;
}

export function UserRow({ user, self, submit }: Props) {
  const [state, action, pending] = useActionState<ActionState, FormData>(submit, { ok: true });
  return (
    <tr className="border-t border-slate-100 align-top dark:border-slate-800" data-testid={`user-${user.email}`}>
      <td className="px-4 py-2 font-medium">{user.name}{self && <span className="ml-1 text-xs text-slate-500">(you)</span>}</td>
      <td className="num px-4 py-2 text-xs">{user.email}</td>
      <td className="px-4 py-2">
        <form action={action}>
          <input type="hidden" name="id" value={user.id} />
          <select name="role" defaultValue={user.role} className="field py-1" aria-label={`Role of ${user.email}`}
            disabled={pending || self} onChange={(e) => e.currentTarget.form?.requestSubmit()}>
            {ROLES.map((r) => <option key={r} value={r}>{r}</option>)}
          </select>
        </form>
      </td>
      <td className="px-4 py-2">
        <form action={action}>
          <input type="hidden" name="id" value={user.id} />
          <input type="hidden" name="disabled" value={String(!user.disabled)} />
          <span className={`mr-2 text-xs ${user.disabled ? "text-fault" : "text-brand-600"}`}>{user.disabled ? "disabled" : "active"}</span>
          {!self && <button className="btn-quiet py-0.5 text-xs" disabled={pending}>{user.disabled ? "Enable" : "Disable"}</button>}
        </form>
      </td>
      <td className="px-4 py-2">
        <form action={action} className="flex gap-1">
          <input type="hidden" name="id" value={user.id} />
          <input name="password" type="password" className="field py-1" placeholder="10+ characters" aria-label={`New password for ${user.email}`} autoComplete="new-password" />
          <button className="btn-quiet py-0.5 text-xs" disabled={pending}>Set</button>
        </form>
        {(state.message || state.fieldErrors) && (
          <p className={`mt-1 text-xs ${state.ok ? "text-brand-600" : "text-fault"}`}>
            {state.message ?? Object.values(state.fieldErrors ?? {}).join(" ")}
          </p>
        )}
      </td>
    </tr>
  );
}
