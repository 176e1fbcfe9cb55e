import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { dbId } from "@/lib/http/fields";
import { requirePageUser } from "@/app/_lib/auth";
import { RecordingNotes } from "@/components/annotations/recording-notes";
import { DeleteRecordingButton } from "@/components/recordings/delete-button";
import { RecordingReplay } from "@/components/recordings/replay";
import { db } from "@/db";
import { findChannelByPath } from "@/db/queries/channels";
import { findRecording } from "@/db/queries/recordings";
import { roleAtLeast } from "@/lib/auth/roles";
import { formatHz } from "@/lib/format/units";
import { formatDuration } from "@/lib/recordings/format";
import { formatDateTime } from "@/lib/format/date-time";

type Params = { params: Promise<{ id: string }> };

const recordingId = (raw: string) => {
  const parsed = dbId.safeParse(raw);
  return parsed.success ? parsed.data : null;
};

export async function generateMetadata({ params }: Params): Promise<Metadata> {
  return { title: `Recording ${(await params).id}` };
}

export default async function RecordingPage({ params }: Params) {
  const user = await requirePageUser();
  const id = recordingId((await params).id);
  const recording = id === null ? undefined : await findRecording(db(), id);
  if (!recording) notFound();
  const channel = await findChannelByPath(db(), recording.channelPath);
  if (!channel) notFound();
  const canEdit = roleAtLeast(user.role, "engineer");
  const canDelete = recording.createdBy === user.id || roleAtLeast(user.role, "lead");
  return (
    <div className="space-y-4">
      <div className="flex flex-wrap items-baseline gap-x-4 gap-y-1">
        <h1 className="text-xl font-semibold">{recording.name}</h1>
        <p className="num text-sm text-slate-500">
          <Link href="/recordings" className="hover:underline">
            Recordings
          </Link>{" "}
          · {recording.channelPath} · {formatHz(recording.sampleRateHz, 6)} · {recording.sampleCount.toLocaleString("en-US")} samples
          {recording.missingCount > 0 && ` (${recording.missingCount.toLocaleString("en-US")} missing)`} · {formatDuration(recording.sampleCount / recording.sampleRateHz)} · {recording.unit}
        </p>
        {canDelete && (
          <div className="ml-auto">
            <DeleteRecordingButton id={recording.id} name={recording.name} after="/recordings" />
          </div>
        )}
      </div>
      <p className="text-sm text-slate-500">
        Uploaded by {recording.authorName} on {formatDateTime(recording.createdAt)}
        {recording.startedAt && <> · captured from {formatDateTime(recording.startedAt)}</>}
        {recording.notes && <> · {recording.notes}</>}
      </p>
      {!canEdit && <p className="text-sm text-slate-500">You are viewing as an operator: the recorded trace and its spectrum are shown; replaying candidate filters needs the engineer role.</p>}
      <RecordingNotes channel={{ path: channel.path, name: channel.name }} startedAt={recording.startedAt?.toISOString() ?? null} durationMs={(recording.sampleCount * 1000) / recording.sampleRateHz} viewer={{ id: user.id, role: user.role }}>
        <RecordingReplay
          recording={{ id: recording.id, channelPath: channel.path, channelName: channel.name, unit: channel.unit, sampleRateHz: recording.sampleRateHz, coefficientFormat: channel.coefficientFormat }}
          canEdit={canEdit}
        />
      </RecordingNotes>
    </div>
  );
}
