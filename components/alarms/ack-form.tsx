"use client";

import { useQueryClient } from "@tanstack/react-query";
import { useState } from "react";
import { ApiError } from "@/components/bench/api";
import { acknowledgeAlarm } from "./api";
import { useAlarmFeed } from "./alarm-feed";

/** Acknowledge with a comment (what was done or seen); the acknowledgement reaches every open page. */
export function AckForm({ eventId, onDone }: { eventId: string; onDone?: () => void }) {
  const { remember } = useAlarmFeed();
  const client = useQueryClient();
  const [comment, setComment] = useState("");
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);

  async function submit(e: React.FormEvent) {
    e.preventDefault();
    setBusy(true);
    setError(null);
    try {
      remember(await acknowledgeAlarm(eventId, comment));
      await client.invalidateQueries({ queryKey: ["alarm-events"] });
      onDone?.();
    } catch (err) {
      setError(err instanceof ApiError || err instanceof Error ? err.message : "The acknowledgement failed.");
    } finally {
      setBusy(false);
    }
  }

  return (
    <form onSubmit={submit} className="mt-2 flex flex-wrap items-start gap-2" aria-label="Acknowledge">
      <textarea
        aria-label="Acknowledgement comment"
        className="field min-w-60 flex-1 py-1"
        rows={1}
        maxLength={500}
        required
        value={comment}
        onChange={(e) => setComment(e.target.value)}
        placeholder="What was done or seen (required)"
      />
      <button className="btn-primary py-1" disabled={busy || comment.trim() === ""}>
        Acknowledge
      </button>
      {error && (
        <p role="alert" className="w-full text-xs text-fault">
          {error}
        </p>
      )}
    </form>
  );
}
