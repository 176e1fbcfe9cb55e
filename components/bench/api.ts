import type { FilterDesign, FilterSpec } from "@/lib/dsp";
import type { SetStatus } from "@/lib/workflow";

/** An API failure in plain words (the route's safe message), with its HTTP status. */
export class ApiError extends Error {
  constructor(
    readonly status: number,
    message: string,
    readonly fields: { path: string; message: string }[] = [],
  ) {
    super(message);
  }
}

const PLAIN: Record<number, string> = {
  401: "Your session has ended. Sign in again.",
  403: "Your role may not do this.",
  404: "Not found.",
  409: "Someone saved a newer revision in the meantime. Reload the list and try again.",
  503: "The server is not reachable right now. Try again shortly.",
};

export async function request<T>(url: string, init?: RequestInit): Promise<T> {
  let res: Response;
  try {
    res = await fetch(url, { ...init, headers: { "content-type": "application/json", ...init?.headers }, credentials: "same-origin" });
  } catch {
    throw new ApiError(0, "The server did not answer. Check the connection and try again.");
  }
  const body: unknown = await res.json().catch(() => null);
  if (!res.ok) {
    const err = (body as { error?: { message?: string; details?: unknown } } | null)?.error;
    const fields = Array.isArray(err?.details) ? (err.details as { path: string; message: string }[]) : [];
    throw new ApiError(res.status, err?.message ?? PLAIN[res.status] ?? `The request failed (HTTP ${res.status}).`, fields);
  }
  return body as T;
}

export interface ProductionFilter {
  revisionId: string | number;
  setName: string;
  revision: number;
  spec: FilterSpec;
  design: FilterDesign;
  activatedAt: string;
}

/** The query key of a channel's production filter (the bench reloads it when a deployment is acknowledged). */
export const productionQueryKey = (path: string) => ["production", path] as const;

/** The production filter of a channel, or null when none is active (404). */
export async function fetchProduction(path: string): Promise<ProductionFilter | null> {
  try {
    return await request<ProductionFilter>(`/api/v1/channels/${path}/production`);
  } catch (err) {
    if (err instanceof ApiError && err.status === 404) return null;
    throw err;
  }
}

export interface SetSummary {
  id: string | number;
  name: string;
  status: SetStatus;
  latestRevision: number;
}

export async function fetchSets(channel: string): Promise<SetSummary[]> {
  const body = await request<{ items: SetSummary[]; total: number }>(`/api/v1/sets?channel=${encodeURIComponent(channel)}`);
  return body.items;
}

export interface SavedRevision {
  setId: string | number;
  revisionId: string | number;
  revision: number;
}

export function createSet(input: { channel: string; name: string; notes?: string; spec: FilterSpec }): Promise<SavedRevision> {
  return request<SavedRevision>("/api/v1/sets", { method: "POST", body: JSON.stringify(input) });
}

export function createRevision(setId: string | number, input: { spec: FilterSpec; notes?: string; expectedLatestRevision: number }): Promise<SavedRevision> {
  return request<SavedRevision>(`/api/v1/sets/${setId}/revisions`, { method: "POST", body: JSON.stringify(input) });
}

/** The address of a kept candidate on the caller's bench of a channel. */
const keptUrl = (channel: string, key: string) => `/api/v1/channels/${channel}/candidates/${encodeURIComponent(key)}`;

/** Keeps a candidate on the caller's bench of a channel (new, or its new spec). */
export function keepCandidate(channel: string, c: { id: string; colorIndex: number; spec: FilterSpec }): Promise<unknown> {
  return request(keptUrl(channel, c.id), { method: "PUT", body: JSON.stringify({ spec: c.spec, colorIndex: c.colorIndex }) });
}

export async function forgetCandidate(channel: string, key: string): Promise<void> {
  await request<null>(keptUrl(channel, key), { method: "DELETE" });
}
