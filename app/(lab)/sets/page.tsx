import type { Metadata } from "next";
import { requirePageUser } from "@/app/_lib/auth";
import { SetsTable } from "@/components/sets/sets-table";
import { db } from "@/db";
import { listChannels } from "@/db/queries/channels";

export const metadata: Metadata = { title: "Coefficient sets" };

export default async function SetsPage() {
  await requirePageUser();
  const channels = await listChannels(db());
  return (
    <section className="card">
      <header className="border-b border-slate-200 px-4 py-3 dark:border-slate-800">
        <h1 className="text-lg font-semibold">Coefficient sets</h1>
        <p className="text-sm text-slate-500">Named filters per channel, each with immutable revisions, reviews and deployments.</p>
      </header>
      <SetsTable channels={channels.map((c) => c.path)} />
    </section>
  );
}
