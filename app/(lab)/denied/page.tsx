import Link from "next/link";
import { requirePageUser } from "@/app/_lib/auth";
import { isRole } from "@/lib/auth/roles";

export default async function DeniedPage({ searchParams }: { searchParams: Promise<{ need?: string }> }) {
  const user = await requirePageUser();
  const { need } = await searchParams;
  return (
    <section className="card mx-auto mt-10 max-w-lg p-6" role="alert">
      <h1 className="text-lg font-semibold">Not available to your role</h1>
      <p className="mt-2 text-sm text-slate-600 dark:text-slate-300">
        You are signed in as <strong>{user.role}</strong>.
        {isRole(need) ? ` That page needs the ${need} role or higher.` : ""} Ask an administrator if you need access.
      </p>
      <Link href="/" className="btn-quiet mt-4">Back to the overview</Link>
    </section>
  );
}
