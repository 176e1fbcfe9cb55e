"use client";

import Link from "next/link";
import { useMemo } from "react";
import { worstSeverity } from "@/lib/alarms/view";
import { useAlarmEvents } from "./alarm-feed";
import { useClock } from "@/components/hooks/use-clock";
import { countOf } from "@/lib/format/plural";

const OPEN = { state: "open" } as const;
const MASKED = { kind: "masked" } as const;
/** Masked events count on the card for this long, ms. */
const RECENT_MS = 3_600_000;

/**
 * A channel card's alarm line: none configured, clear, or what is open (red; raised first), and
 * apart from it how often the filter hid an excursion in the last hour. Fed by the page's
 * <AlarmFeed>, so it changes as alarms are pushed.
 */
export function AlarmSlot({ path, ruleCount }: { path: string; ruleCount: number }) {
  const open = useAlarmEvents(OPEN);
  const masked = useAlarmEvents(MASKED, 100);
  const now = useClock(60_000);
  const mine = useMemo(() => open.events.filter((e) => e.channel === path), [open.events, path]);
  const hidden = masked.events.filter((e) => e.channel === path && now - Date.parse(e.raisedAt) < RECENT_MS).length;
  const raised = mine.filter((e) => e.state === "raised");
  const unacknowledged = mine.filter((e) => e.acknowledgedAt === null).length;
  const href = `/alarms?channel=${encodeURIComponent(path)}`;

  if (ruleCount === 0 && mine.length === 0) {
    return (
      <p className="mt-1.5 text-xs text-slate-400" data-testid="alarm-state" data-alarm="none">
        alarms: none configured
      </p>
    );
  }
  return (
    <div className="mt-1.5 space-y-0.5 text-xs" data-testid="alarm-state" data-alarm={raised.length ? "raised" : mine.length ? "unacknowledged" : "clear"}>
      {mine.length === 0 ? (
        <p className="text-slate-500">
          alarms: clear · {countOf(ruleCount, "rule")}
        </p>
      ) : (
        <Link href={href} className="block font-medium text-fault hover:underline">
          <span aria-hidden className="mr-1 inline-block size-2 rounded-full bg-fault align-middle" />
          {raised.length > 0 ? `${raised.length} raised` : "cleared"}
          {unacknowledged > 0 && ` · ${unacknowledged} to acknowledge`} · {worstSeverity(mine)}: {(raised[0] ?? mine[0]).ruleName}
        </Link>
      )}
      {hidden > 0 && (
        <Link href={`${href}&kind=masked`} className="block text-fault/90 underline decoration-dashed underline-offset-2" data-testid="masked-count">
          filter hid {countOf(hidden, "excursion")} in the last hour
        </Link>
      )}
    </div>
  );
}
