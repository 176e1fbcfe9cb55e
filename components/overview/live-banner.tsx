"use client";

import { Notice } from "@/components/ui/notice";
import { useLiveOverview } from "./use-live-overview";

/** One page-level word on the live service when it cannot be reached, so the cards can stay short. */
export function LiveBanner() {
  const query = useLiveOverview();
  if (!query.isError) return null;
  return (
    <Notice tone={query.data ? "warn" : "error"} title={query.data ? "Live state is out of date" : "Live state unavailable"}>
      {query.error.message}
    </Notice>
  );
}
