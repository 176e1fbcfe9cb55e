/** Shown while the channel is looked up. */
export default function Loading() {
  return (
    <div role="status" className="space-y-4">
      <p className="text-sm text-slate-500">Opening the channel…</p>
      <div className="card h-96 animate-pulse bg-slate-100 dark:bg-slate-900" />
    </div>
  );
}
