"use client";

import { useEffect, useState } from "react";
import type { LiveStatus } from "./use-live-channel";

/** How long without a frame before the stream counts as stalled, in ms (product choice). */
const STALL_MS = 3000;

/** The state of the live link in words: connecting, live, reconnecting (with the countdown), paused, stalled, frames dropped. */
export function ConnectionBadge({ status, paused }: { status: LiveStatus; paused: boolean }) {
  const [now, setNow] = useState(() => Date.now());
  useEffect(() => {
    const id = setInterval(() => setNow(Date.now()), 1000);
    return () => clearInterval(id);
  }, []);
  let text: string;
  let tone: "ok" | "wait" | "bad";
  if (status.link === "signed-out") {
    text = "Session ended · sign in again";
    tone = "bad";
  } else if (status.link === "reconnecting") {
    const s = status.retryAt ? Math.max(0, Math.ceil((status.retryAt - now) / 1000)) : 0;
    text = s > 0 ? `Reconnecting in ${s} s` : "Reconnecting…";
    tone = "bad";
  } else if (status.link === "connecting") {
    text = "Connecting…";
    tone = "wait";
  } else if (paused) {
    text = "Paused";
    tone = "wait";
  } else if (status.mqtt && status.mqtt !== "connected") {
    text = "Live · broker reconnecting";
    tone = "wait";
  } else if (!status.lastFrameAt || now - status.lastFrameAt > STALL_MS) {
    text = "Live · no samples arriving";
    tone = "wait";
  } else {
    text = "Live";
    tone = "ok";
  }
  const dot = { ok: "bg-emerald-500", wait: "bg-amber-400", bad: "bg-fault" }[tone];
  return (
    <span role="status" aria-live="polite" data-testid="link-state" data-link={status.link} className="inline-flex items-center gap-2 text-sm">
      <span className={`h-2 w-2 rounded-full ${dot}`} aria-hidden="true" />
      <span>{text}</span>
      {status.droppedFrames > 0 && (
        <span className="num rounded bg-amber-100 px-1.5 text-xs text-amber-900 dark:bg-amber-900/40 dark:text-amber-200">{status.droppedFrames} frames dropped</span>
      )}
    </span>
  );
}
