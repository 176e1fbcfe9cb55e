"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";
import { deleteRecording } from "./api";
import { errorMessage } from "@/lib/errors";

/** Deletes a recording after a confirmation, then goes to `after` (or refreshes the page). */
export function DeleteRecordingButton({ id, name, after }: { id: number; name: string; after?: string }) {
  const router = useRouter();
  const [error, setError] = useState<string | null>(null);
  const [pending, setPending] = useState(false);
  const remove = async () => {
    if (!window.confirm(`Delete the recording "${name}"? Its samples cannot be restored.`)) return;
    setPending(true);
    try {
      await deleteRecording(id);
      if (after) router.push(after);
      else router.refresh();
    } catch (err) {
      setError(errorMessage(err));
      setPending(false);
    }
  };
  return (
    <span className="inline-flex items-center gap-2">
      <button type="button" className="btn-quiet px-2 py-1 text-xs" onClick={remove} disabled={pending} aria-label={`Delete ${name}`}>
        Delete
      </button>
      {error && (
        <span role="alert" className="text-xs text-fault">
          {error}
        </span>
      )}
    </span>
  );
}
