import Link from "next/link";

export default function LoopChannelNotFound() {
  return (
    <div role="alert" className="card max-w-xl p-6">
      <h1 className="text-lg font-semibold">No such channel</h1>
      <p className="mt-1 text-sm text-slate-600 dark:text-slate-300">
        The address does not name a channel of this lab (it should read /loop/&lt;rig&gt;/&lt;device&gt;/&lt;channel&gt;). Pick one from the overview.
      </p>
      <Link href="/" className="btn-primary mt-4">
        Back to the overview
      </Link>
    </div>
  );
}
