"use client";

import { useQueryClient } from "@tanstack/react-query";
import { useEffect, useState } from "react";
import { ApiError } from "@/components/bench/api";
import { fromUtcInput, toUtcInput } from "@/lib/alarms/utc-input";
import { ChannelSelect } from "@/components/alarms/channel-select";
import { createAnnotation } from "./api";

/**
 * Marks a moment or a span of a channel with a short note. `channels` offers a choice; with one
 * channel it is fixed. Times are typed in UTC, as every list and chart shows them. Without
 * `defaultAt` (epoch ms) the time follows the clock until it is edited ("Now" makes it follow
 * again), so a note written on the live bench lands at the moment it is saved.
 */
export function AnnotationForm({ channels, defaultAt }: { channels: { path: string; name: string }[]; defaultAt?: number }) {
  const client = useQueryClient();
  const [channel, setChannel] = useState(channels[0]?.path ?? "");
  const [at, setAt] = useState(() => toUtcInput(defaultAt ?? Date.now()));
  const [following, setFollowing] = useState(defaultAt === undefined);
  useEffect(() => {
    if (!following) return;
    const id = setInterval(() => setAt(toUtcInput(Date.now())), 1000);
    return () => clearInterval(id);
  }, [following]);
  const [endAt, setEndAt] = useState("");
  const [span, setSpan] = useState(false);
  const [text, setText] = useState("");
  const [message, setMessage] = useState<{ ok: boolean; text: string } | null>(null);
  const [busy, setBusy] = useState(false);

  async function submit(e: React.FormEvent) {
    e.preventDefault();
    const from = following ? Date.now() : fromUtcInput(at);
    const to = span ? fromUtcInput(endAt) : null;
    if (from === null || (span && to === null)) return setMessage({ ok: false, text: "Give the time as date and time (UTC)." });
    if (to !== null && to <= from) return setMessage({ ok: false, text: "The span must end after it starts." });
    setBusy(true);
    setMessage(null);
    try {
      await createAnnotation({ channel, at: new Date(from).toISOString(), endAt: to === null ? null : new Date(to).toISOString(), text });
      setText("");
      setMessage({ ok: true, text: "Annotation saved." });
      await client.invalidateQueries({ queryKey: ["annotations"] });
    } catch (err) {
      setMessage({ ok: false, text: err instanceof ApiError ? err.message : "The annotation could not be saved." });
    } finally {
      setBusy(false);
    }
  }

  return (
    <form onSubmit={submit} aria-label="Add an annotation" className="flex flex-wrap items-end gap-2">
      <label className="w-full text-sm">
        <span className="label">Note</span>
        <input
          aria-label="Annotation text"
          className="field py-1"
          maxLength={500}
          required
          value={text}
          onChange={(e) => setText(e.target.value)}
          placeholder="A test step, a valve change, a sensor swap…"
        />
      </label>
      {channels.length > 1 && (
        <ChannelSelect channels={channels} value={channel} onChange={setChannel} />
      )}
      <label className="text-sm">
        <span className="label">{span ? "From (UTC)" : "At (UTC)"}</span>
        <input
          aria-label={span ? "From (UTC)" : "At (UTC)"}
          type="datetime-local"
          step={1}
          className="field num w-auto py-1"
          value={at}
          onChange={(e) => {
            setFollowing(false);
            setAt(e.target.value);
          }}
          required
        />
      </label>
      <button type="button" className="btn-quiet py-1" aria-pressed={following} onClick={() => {
          setFollowing(true);
          setAt(toUtcInput(Date.now()));
        }}>
        Now
      </button>
      <label className="flex items-center gap-1.5 self-center text-sm">
        <input type="checkbox" checked={span} onChange={(e) => setSpan(e.target.checked)} /> a span
      </label>
      {span && (
        <label className="text-sm">
          <span className="label">To (UTC)</span>
          <input aria-label="To (UTC)" type="datetime-local" step={1} className="field num w-auto py-1" value={endAt} onChange={(e) => setEndAt(e.target.value)} required />
        </label>
      )}
      <button className="btn-primary" disabled={busy || text.trim() === "" || channel === ""}>
        Add annotation
      </button>
      {message && (
        <p role={message.ok ? "status" : "alert"} className={`w-full text-xs ${message.ok ? "text-brand-600" : "text-fault"}`}>
          {message.text}
        </p>
      )}
    </form>
  );
}
