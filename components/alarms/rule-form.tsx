"use client";

import { useState } from "react";
import { ApiError } from "@/components/bench/api";
import { limitProblems } from "@/lib/alarms";
import { ALARM_SEVERITIES, ALARM_SIGNALS } from "@/lib/protocol";
import type { AlarmRuleRow, RuleFields } from "./api";
import type { ChannelOption } from "./alarms-board";
import { ChannelSelect } from "./channel-select";

type Draft = Record<"name" | "high" | "low" | "deadband" | "minDurationMs", string> & Pick<RuleFields, "signal" | "severity" | "enabled"> & { channel: string };

const numberOrNull = (text: string): number | null => (text.trim() === "" ? null : Number(text));

function draftOf(rule: AlarmRuleRow | null, channel: string): Draft {
  return {
    channel: rule?.channel ?? channel,
    name: rule?.name ?? "",
    signal: rule?.signal ?? "filtered",
    high: rule && rule.high !== null ? String(rule.high) : "",
    low: rule && rule.low !== null ? String(rule.low) : "",
    deadband: String(rule?.deadband ?? 0),
    minDurationMs: String(rule?.minDurationMs ?? 0),
    severity: rule?.severity ?? "warning",
    enabled: rule?.enabled ?? true,
  };
}

/** A new rule (with its channel) or the fields of an existing one; checks the limits as they are typed, the server checks again. */
export function RuleForm({
  rule,
  channels,
  onSave,
  onCancel,
}: {
  rule: AlarmRuleRow | null;
  channels: ChannelOption[];
  onSave: (fields: RuleFields & { channel: string }) => Promise<void>;
  onCancel: () => void;
}) {
  const [d, setD] = useState<Draft>(() => draftOf(rule, channels[0]?.path ?? ""));
  const [errors, setErrors] = useState<{ path: string; message: string }[]>([]);
  const [busy, setBusy] = useState(false);
  const set = (change: Partial<Draft>) => setD((old) => ({ ...old, ...change }));
  const fields: RuleFields = {
    name: d.name.trim(),
    signal: d.signal,
    high: numberOrNull(d.high),
    low: numberOrNull(d.low),
    deadband: Number(d.deadband),
    minDurationMs: Number(d.minDurationMs),
    severity: d.severity,
    enabled: d.enabled,
  };
  const problems = limitProblems(fields);
  const unit = channels.find((c) => c.path === d.channel)?.unit ?? "";
  const errorFor = (path: string) => [...problems, ...errors].find((p) => p.path === path)?.message;

  async function submit(e: React.FormEvent) {
    e.preventDefault();
    if (problems.length) return;
    setBusy(true);
    setErrors([]);
    try {
      await onSave({ ...fields, channel: d.channel });
    } catch (err) {
      setErrors(err instanceof ApiError ? (err.fields.length ? err.fields : [{ path: "", message: err.message }]) : [{ path: "", message: "The rule could not be saved." }]);
    } finally {
      setBusy(false);
    }
  }

  const input = (key: "name" | "high" | "low" | "deadband" | "minDurationMs", label: string, extra: React.InputHTMLAttributes<HTMLInputElement> = {}) => (
    <label className="text-sm">
      <span className="label">{label}</span>
      <input className="field num py-1" value={d[key]} onChange={(e) => set({ [key]: e.target.value })} {...extra} />
      {errorFor(key) && <span className="mt-0.5 block text-xs text-fault">{errorFor(key)}</span>}
    </label>
  );

  return (
    <form onSubmit={submit} aria-label={rule ? `Edit ${rule.name}` : "New alarm rule"} className="grid gap-3 rounded-md border border-slate-200 p-3 sm:grid-cols-2 lg:grid-cols-4 dark:border-slate-800">
      {rule ? (
        <p className="text-sm lg:col-span-4">
          <span className="label">Channel</span>
          <span className="num">{rule.channel}</span>
        </p>
      ) : (
        <ChannelSelect channels={channels} value={d.channel} onChange={(channel) => set({ channel })} className="sm:col-span-2" />
      )}
      {input("name", "Name", { maxLength: 80, required: true })}
      <label className="text-sm">
        <span className="label">Watches</span>
        <select className="field py-1" value={d.signal} onChange={(e) => set({ signal: ALARM_SIGNALS.find((s) => s === e.target.value) ?? "filtered" })}>
          <option value="filtered">filtered (production)</option>
          <option value="raw">raw</option>
        </select>
      </label>
      {input("high", `High limit (${unit})`, { inputMode: "decimal", placeholder: "none" })}
      {input("low", `Low limit (${unit})`, { inputMode: "decimal", placeholder: "none" })}
      {input("deadband", `Deadband (${unit})`, { inputMode: "decimal" })}
      {input("minDurationMs", "Minimum time over (ms)", { inputMode: "numeric" })}
      <label className="text-sm">
        <span className="label">Severity</span>
        <select className="field py-1" value={d.severity} onChange={(e) => set({ severity: ALARM_SEVERITIES.find((s) => s === e.target.value) ?? "warning" })}>
          {ALARM_SEVERITIES.map((s) => (
            <option key={s} value={s}>
              {s}
              {s === "critical" ? " (also mailed)" : ""}
            </option>
          ))}
        </select>
      </label>
      <label className="flex items-center gap-2 self-end text-sm">
        <input type="checkbox" checked={d.enabled} onChange={(e) => set({ enabled: e.target.checked })} /> Enabled
      </label>
      <div className="flex flex-wrap items-center gap-2 lg:col-span-4">
        <button className="btn-primary" disabled={busy || problems.length > 0}>
          {rule ? "Save changes" : "Add rule"}
        </button>
        <button type="button" className="btn-quiet" onClick={onCancel}>
          Cancel
        </button>
        {errorFor("") && <p role="alert" className="text-sm text-fault">{errorFor("")}</p>}
      </div>
    </form>
  );
}
