import { isOpenAlarm, type AlarmEventView, type AlarmKind, type AlarmSeverity, type AlarmState } from "@/lib/protocol";

/** What a list of alarm events shows; the same fields as the events API's query. */
export interface EventFilter {
  channel?: string;
  rig?: string;
  severity?: AlarmSeverity;
  kind?: AlarmKind;
  state?: AlarmState | "open";
}

const RANK: Record<AlarmSeverity, number> = { advisory: 0, warning: 1, critical: 2 };

export function matchesFilter(e: AlarmEventView, f: EventFilter): boolean {
  if (f.channel && e.channel !== f.channel) return false;
  if (f.rig && e.channel.split("/")[0] !== f.rig) return false;
  if (f.severity && e.severity !== f.severity) return false;
  if (f.kind && e.kind !== f.kind) return false;
  if (f.state === "open") return isOpenAlarm(e);
  return !f.state || e.state === f.state;
}

/** Open lists: raised first, then the most severe, then newest; other lists newest first. */
export function sortEvents(events: AlarmEventView[], f: EventFilter): AlarmEventView[] {
  const newest = (a: AlarmEventView, b: AlarmEventView) => Date.parse(b.raisedAt) - Date.parse(a.raisedAt) || a.id.localeCompare(b.id);
  if (f.state !== "open") return [...events].sort(newest);
  return [...events].sort((a, b) => Number(b.state === "raised") - Number(a.state === "raised") || RANK[b.severity] - RANK[a.severity] || newest(a, b));
}

/**
 * A fetched list brought up to date with what was pushed since: a pushed event replaces the fetched
 * one with its id (it is newer), new ones that match the filter join, and any that no longer match
 * (an acknowledged, cleared alarm in an open list) leave.
 */
export function mergeEvents(fetched: readonly AlarmEventView[], pushed: Iterable<AlarmEventView>, f: EventFilter): AlarmEventView[] {
  const byId = new Map(fetched.map((e) => [e.id, e]));
  for (const e of pushed) byId.set(e.id, e);
  return sortEvents([...byId.values()].filter((e) => matchesFilter(e, f)), f);
}

/** The most severe of some events, or null for none. */
export function worstSeverity(events: readonly AlarmEventView[]): AlarmSeverity | null {
  let worst: AlarmSeverity | null = null;
  for (const e of events) if (worst === null || RANK[e.severity] > RANK[worst]) worst = e.severity;
  return worst;
}

/** A query string from fields (undefined and empty ones left out), with its "?", or "" for none. */
export function queryString(fields: object): string {
  const params = new URLSearchParams();
  for (const [k, v] of Object.entries(fields)) if (v !== undefined && v !== "") params.set(k, String(v));
  const text = params.toString();
  return text ? `?${text}` : "";
}
