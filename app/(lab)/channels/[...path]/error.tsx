"use client";

/** Something failed while drawing the bench; the rest of the app still works. */
export default function BenchError({ reset }: { error: Error; reset: () => void }) {
  return (
    <div role="alert" className="card max-w-xl p-6">
      <h1 className="text-lg font-semibold">The bench could not be shown</h1>
      <p className="mt-1 text-sm text-slate-600 dark:text-slate-300">Something went wrong while loading this channel. Try again; if it keeps failing, the database or the server may be down.</p>
      <button type="button" className="btn-primary mt-4" onClick={reset}>
        Try again
      </button>
    </div>
  );
}
