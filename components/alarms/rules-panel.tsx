"use client";

import { useQuery, useQueryClient } from "@tanstack/react-query";
import { useState } from "react";
import { ApiError } from "@/components/bench/api";
import { Notice } from "@/components/ui/notice";
import { durationText } from "@/lib/alarms/describe";
import { trim } from "@/lib/format/units";
import { createAlarmRule, deleteAlarmRule, fetchAlarmRules, updateAlarmRule, type AlarmRuleRow } from "./api";
import type { ChannelOption } from "./alarms-board";
import { RuleForm } from "./rule-form";

const limits = (r: AlarmRuleRow) =>
  [r.low !== null && `below ${trim(r.low, 6)}`, r.high !== null && `above ${trim(r.high, 6)}`].filter(Boolean).join(" or ") + ` ${r.unit}`;

/**
 * The lab's alarm rules; engineers and leads add, edit, disable and delete them (each change is
 * audited, and the live service picks it up at once). Everyone else reads them.
 */
export function RulesPanel({ initial, channels, canEdit }: { initial: AlarmRuleRow[]; channels: ChannelOption[]; canEdit: boolean }) {
  const client = useQueryClient();
  const rules = useQuery({ queryKey: ["alarm-rules"], queryFn: () => fetchAlarmRules(), initialData: initial });
  const [editing, setEditing] = useState<number | "new" | null>(null);
  const [error, setError] = useState<string | null>(null);
  const refresh = () => client.invalidateQueries({ queryKey: ["alarm-rules"] });

  async function act(fn: () => Promise<unknown>) {
    setError(null);
    try {
      await fn();
      await refresh();
    } catch (err) {
      setError(err instanceof ApiError ? err.message : "The change could not be made.");
    }
  }

  return (
    <section className="card overflow-hidden" aria-labelledby="rules-h">
      <div className="flex flex-wrap items-center gap-3 border-b border-slate-200 px-3 py-2 dark:border-slate-800">
        <h2 id="rules-h" className="font-medium">
          Rules
        </h2>
        {canEdit && editing !== "new" && (
          <button type="button" className="btn-quiet ml-auto py-1" onClick={() => setEditing("new")}>
            Add a rule
          </button>
        )}
      </div>
      <div className="space-y-3 p-3">
        <Notice tone="warn" title="Alarms here help operators watch; they are not a protective function">
          A rule on the filtered signal sees only what the production filter lets through: the filter&apos;s lag delays the alarm, and a notch or a low-pass can
          hide a real excursion (those show as &quot;filter hid an excursion&quot;). Confirm limits with your team&apos;s review and the machine&apos;s safety
          documentation; local codes and licensed engineers decide.
        </Notice>
        {error && <Notice tone="error" title="Not changed">{error}</Notice>}
        {editing === "new" && (
          <RuleForm rule={null} channels={channels} onCancel={() => setEditing(null)} onSave={async (r) => { await createAlarmRule(r); await refresh(); setEditing(null); }} />
        )}
        {rules.data.length === 0 ? (
          <p className="text-sm text-slate-500">No rules yet.{canEdit ? " Add one to have the live service watch a channel." : " Engineers and leads add them."}</p>
        ) : (
          <table className="w-full text-sm">
            <thead className="text-left text-xs uppercase tracking-wide text-slate-500">
              <tr>
                <th className="py-1 pr-3">Rule</th>
                <th className="pr-3">Channel</th>
                <th className="pr-3">Watches</th>
                <th className="pr-3">Raises when</th>
                <th className="pr-3">Clears after</th>
                <th className="pr-3">Severity</th>
                <th className="pr-3">State</th>
                {canEdit && <th />}
              </tr>
            </thead>
            <tbody>
              {rules.data.map((r) =>
                editing === r.id ? (
                  <tr key={r.id}>
                    <td colSpan={8} className="py-2">
                      <RuleForm rule={r} channels={channels} onCancel={() => setEditing(null)} onSave={async ({ channel: _channel, ...fields }) => { await updateAlarmRule(r.id, fields); await refresh(); setEditing(null); }} />
                    </td>
                  </tr>
                ) : (
                  <tr key={r.id} className="border-t border-slate-100 align-top dark:border-slate-800" data-testid="alarm-rule" data-rule={r.name}>
                    <td className="py-1.5 pr-3 font-medium">{r.name}</td>
                    <td className="num pr-3 text-xs">{r.channel}</td>
                    <td className="pr-3">{r.signal}</td>
                    <td className="num pr-3">
                      {limits(r)}
                      {r.minDurationMs > 0 && <span className="text-xs text-slate-500"> for {durationText(r.minDurationMs)}</span>}
                    </td>
                    <td className="num pr-3">{r.deadband > 0 ? `${trim(r.deadband, 6)} ${r.unit} back inside` : "back inside"}</td>
                    <td className="pr-3">{r.severity}</td>
                    <td className="pr-3">{r.enabled ? "on" : <span className="text-slate-500">disabled</span>}</td>
                    {canEdit && (
                      <td className="whitespace-nowrap text-right">
                        <button type="button" className="btn-quiet py-0.5 text-xs" onClick={() => setEditing(r.id)}>Edit</button>{" "}
                        <button type="button" className="btn-quiet py-0.5 text-xs" onClick={() => act(() => updateAlarmRule(r.id, { enabled: !r.enabled }))}>
                          {r.enabled ? "Disable" : "Enable"}
                        </button>{" "}
                        <button
                          type="button"
                          className="btn-quiet py-0.5 text-xs"
                          onClick={() => window.confirm(`Delete the rule "${r.name}"? Its past alarms stay in the history.`) && act(() => deleteAlarmRule(r.id))}
                        >
                          Delete
                        </button>
                      </td>
                    )}
                  </tr>
                ),
              )}
            </tbody>
          </table>
        )}
      </div>
    </section>
  );
}
