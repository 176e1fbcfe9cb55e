import Link from "next/link";

/** The app's own "not found" card: what was not found, why, and the way back (served with HTTP 404). */
export function NotFoundCard({ title, children }: { title: string; children: React.ReactNode }) {
  return (
    <div role="alert" className="card max-w-xl p-6">
      <h1 className="text-lg font-semibold">{title}</h1>
      <p className="mt-1 text-sm text-slate-600 dark:text-slate-300">{children}</p>
      <Link href="/" className="btn-primary mt-4">
        Back to the overview
      </Link>
    </div>
  );
}
