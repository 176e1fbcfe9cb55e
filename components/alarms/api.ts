import { z } from "zod";
import { request } from "@/components/bench/api";
import type { AlarmRule } from "@/lib/alarms";
import { queryString, type EventFilter } from "@/lib/alarms/view";
import { ALARM_SEVERITIES, ALARM_SIGNALS, alarmEventSchema, channelPathSchema, type AlarmEventView } from "@/lib/protocol";

const events = z.array(alarmEventSchema);

export async function fetchAlarmEvents(filter: EventFilter & { limit?: number }): Promise<AlarmEventView[]> {
  return events.parse(await request<unknown>(`/api/v1/alarm-events${queryString(filter)}`));
}

export async function acknowledgeAlarm(id: string, comment: string): Promise<AlarmEventView> {
  return alarmEventSchema.parse(await request<unknown>(`/api/v1/alarm-events/${id}/acknowledge`, { method: "POST", body: JSON.stringify({ comment }) }));
}

export const alarmRuleSchema = z.object({
  id: z.number().int(),
  channel: channelPathSchema,
  unit: z.string(),
  name: z.string(),
  signal: z.enum(ALARM_SIGNALS),
  high: z.number().nullable(),
  low: z.number().nullable(),
  deadband: z.number(),
  minDurationMs: z.number().int(),
  severity: z.enum(ALARM_SEVERITIES),
  enabled: z.boolean(),
  createdBy: z.string(),
});
export type AlarmRuleRow = z.infer<typeof alarmRuleSchema>;

export async function fetchAlarmRules(channel?: string): Promise<AlarmRuleRow[]> {
  const query = channel ? `?channel=${encodeURIComponent(channel)}` : "";
  return z.array(alarmRuleSchema).parse(await request<unknown>(`/api/v1/alarm-rules${query}`));
}

/** The fields a rule form sends. */
export type RuleFields = Omit<AlarmRule, "id" | "channel">;

export async function createAlarmRule(input: RuleFields & { channel: string }): Promise<AlarmRuleRow> {
  return alarmRuleSchema.parse(await request<unknown>("/api/v1/alarm-rules", { method: "POST", body: JSON.stringify(input) }));
}

export async function updateAlarmRule(id: number, patch: Partial<RuleFields>): Promise<AlarmRuleRow> {
  return alarmRuleSchema.parse(await request<unknown>(`/api/v1/alarm-rules/${id}`, { method: "PATCH", body: JSON.stringify(patch) }));
}

export async function deleteAlarmRule(id: number): Promise<void> {
  await request<unknown>(`/api/v1/alarm-rules/${id}`, { method: "DELETE" });
}
