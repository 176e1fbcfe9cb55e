"use client";

import { useRouter } from "next/navigation";
import { useRef, useState, type FormEvent } from "react";
import { ApiError } from "@/components/bench/api";
import { formatHz } from "@/lib/format/units";
import { MAX_SAMPLES, MAX_UPLOAD_BYTES } from "@/lib/recordings/limits";
import { uploadRecording, type FieldError, type UploadProgress } from "./api";
import { errorMessage } from "@/lib/errors";

export interface ChannelChoice {
  path: string;
  name: string;
  unit: string;
  sampleRateHz: number;
}

function FieldNote({ errors, path }: { errors: FieldError[]; path: string }) {
  const mine = errors.filter((e) => e.path === path);
  if (mine.length === 0) return null;
  return (
    <p className="mt-1 text-xs text-fault" data-field-error={path}>
      {mine.map((e) => e.message).join(" ")}
    </p>
  );
}

/**
 * Upload a CSV capture of one channel: the channel, the file, an optional rate (needed when the file
 * has no time column), a name and notes. Errors appear beside their fields; nothing is stored on error.
 */
export function UploadForm({ channels, defaultChannel }: { channels: ChannelChoice[]; defaultChannel?: string }) {
  const router = useRouter();
  const [errors, setErrors] = useState<FieldError[]>([]);
  const [message, setMessage] = useState<string | null>(null);
  const [pending, setPending] = useState(false);
  const [progress, setProgress] = useState<UploadProgress | null>(null);
  const abort = useRef<AbortController | null>(null);
  const [channel, setChannel] = useState(defaultChannel ?? channels[0]?.path ?? "");
  const chosen = channels.find((c) => c.path === channel);

  const submit = async (e: FormEvent<HTMLFormElement>) => {
    e.preventDefault();
    const form = new FormData(e.currentTarget);
    const file = form.get("file");
    if (!(file instanceof File) || file.size === 0) {
      setErrors([{ path: "file", message: "Choose a CSV file." }]);
      return;
    }
    setPending(true);
    setErrors([]);
    setMessage(null);
    setProgress({ sent: 0, total: file.size });
    abort.current = new AbortController();
    try {
      const id = await uploadRecording(form, { onProgress: setProgress, signal: abort.current.signal });
      router.push(`/recordings/${id}`);
    } catch (err) {
      const fields = err instanceof ApiError ? err.fields : [];
      setErrors(fields);
      setMessage(fields.length ? null : errorMessage(err));
      setPending(false);
      setProgress(null);
    }
  };

  return (
    <form onSubmit={submit} className="grid gap-3 p-4 md:grid-cols-2" aria-label="Upload a recording">
      <div>
        <label htmlFor="rec-channel" className="label">
          Channel
        </label>
        <select id="rec-channel" name="channel" className="field" value={channel} onChange={(e) => setChannel(e.target.value)}>
          {channels.map((c) => (
            <option key={c.path} value={c.path}>
              {c.path} · {formatHz(c.sampleRateHz)} · {c.unit}
            </option>
          ))}
        </select>
        <FieldNote errors={errors} path="channel" />
      </div>
      <div>
        <label htmlFor="rec-file" className="label">
          CSV file
        </label>
        <input id="rec-file" name="file" type="file" accept=".csv,text/csv" className="field py-1" />
        <FieldNote errors={errors} path="file" />
      </div>
      <div>
        <label htmlFor="rec-rate" className="label">
          Sample rate (Hz, optional)
        </label>
        <input id="rec-rate" name="sampleRateHz" type="number" step="any" min="0" className="field num" placeholder={chosen ? `read from the time column; the channel runs at ${chosen.sampleRateHz}` : ""} />
        <FieldNote errors={errors} path="sampleRateHz" />
      </div>
      <div>
        <label htmlFor="rec-name" className="label">
          Name (optional)
        </label>
        <input id="rec-name" name="name" type="text" maxLength={120} className="field" placeholder="the file's name" />
        <FieldNote errors={errors} path="name" />
      </div>
      <div className="md:col-span-2">
        <label htmlFor="rec-notes" className="label">
          Notes: operating condition, sensor, firmware (optional)
        </label>
        <textarea id="rec-notes" name="notes" rows={2} maxLength={4000} className="field" />
        <FieldNote errors={errors} path="notes" />
      </div>
      <div className="flex flex-wrap items-center gap-3 md:col-span-2">
        <button className="btn-primary" disabled={pending || !channel}>
          {pending ? "Uploading…" : "Upload recording"}
        </button>
        {pending && progress && (
          <>
            <progress className="h-2 w-48 accent-brand-600" max={progress.total || undefined} value={progress.sent} aria-label="Upload progress" />
            <span className="num text-xs text-slate-500" data-testid="upload-progress">
              {(progress.sent / 1e6).toFixed(1)} of {(progress.total / 1e6).toFixed(1)} MB sent
              {progress.total > 0 && progress.sent >= progress.total ? "; the server is checking it…" : ""}
            </span>
            <button type="button" className="btn-quiet" onClick={() => abort.current?.abort()}>
              Cancel upload
            </button>
          </>
        )}
        {message && (
          <p role="alert" className="text-sm text-fault">
            {message}
          </p>
        )}
        <p className="text-xs text-slate-500">
          CSV with a header row: first column <code>t_s</code> (seconds) or ISO 8601 UTC timestamps, then one value column with its unit, like <code>torque[N·m]</code>. Empty or NaN cells mark
          missing samples (never 0). Up to {MAX_SAMPLES.toLocaleString("en-US")} samples and {MAX_UPLOAD_BYTES / 1e6} MB; the rate must match the channel&apos;s within 0.1 %.
        </p>
      </div>
    </form>
  );
}
