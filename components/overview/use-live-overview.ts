"use client";

import { useQuery } from "@tanstack/react-query";
import { liveOverviewSchema, type LiveOverview } from "@/lib/protocol";

export const LIVE_OVERVIEW_URL = "/api/v1/live/overview";

/** Why the live state is missing, in words for the card. */
export class LiveOverviewError extends Error {
  constructor(
    readonly status: number,
    message: string,
  ) {
    super(message);
  }
}

async function fetchLiveOverview(): Promise<LiveOverview> {
  const res = await fetch(LIVE_OVERVIEW_URL, { cache: "no-store" });
  const body: unknown = await res.json().catch(() => null);
  if (!res.ok) {
    const message = (body as { error?: { message?: unknown } } | null)?.error?.message;
    throw new LiveOverviewError(res.status, typeof message === "string" ? message : `The live state could not be loaded (HTTP ${res.status}).`);
  }
  return liveOverviewSchema.parse(body);
}

/** The lab's live state, polled every 2 s; every card shares this one query (one request per poll). */
export function useLiveOverview() {
  return useQuery({
    queryKey: ["live-overview"],
    queryFn: fetchLiveOverview,
    refetchInterval: 2_000,
    refetchIntervalInBackground: false,
    staleTime: 0,
    retry: false,
  });
}
