import type { Metadata } from "next";
import { requirePageUser } from "@/app/_lib/auth";
import { RecordingsTable } from "@/components/recordings/recordings-table";
import { UploadForm } from "@/components/recordings/upload-form";
import { db } from "@/db";
import { listChannels } from "@/db/queries/channels";
import { listRecordings } from "@/db/queries/recordings";
import { roleAtLeast } from "@/lib/auth/roles";

export const metadata: Metadata = { title: "Recordings" };

type Props = { searchParams: Promise<{ channel?: string }> };

export default async function RecordingsPage({ searchParams }: Props) {
  const user = await requirePageUser();
  const { channel } = await searchParams;
  const [recordings, channels] = await Promise.all([listRecordings(db()), listChannels(db())]);
  const canUpload = roleAtLeast(user.role, "engineer");
  return (
    <div className="space-y-4">
      <section className="card">
        <header className="border-b border-slate-200 px-4 py-3 dark:border-slate-800">
          <h1 className="text-lg font-semibold">Recordings</h1>
          <p className="text-sm text-slate-500">Captures of a channel, replayed offline through candidate filters.</p>
        </header>
        <RecordingsTable recordings={recordings} canDelete={(r) => r.createdBy === user.id || roleAtLeast(user.role, "lead")} />
      </section>
      {canUpload ? (
        <section className="card" aria-label="Upload">
          <header className="border-b border-slate-200 px-4 py-3 dark:border-slate-800">
            <h2 className="font-medium">Upload a recording</h2>
          </header>
          <UploadForm channels={channels.map((c) => ({ path: c.path, name: c.name, unit: c.unit, sampleRateHz: c.sampleRateHz }))} defaultChannel={channel} />
        </section>
      ) : (
        <p className="text-sm text-slate-500">Uploading recordings needs the engineer role.</p>
      )}
    </div>
  );
}
