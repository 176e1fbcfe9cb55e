import Link from "next/link";
import type { RecordingSummary } from "@/lib/recordings/summary";
import { formatHz } from "@/lib/format/units";
import { formatDuration } from "@/lib/recordings/format";
import { DeleteRecordingButton } from "./delete-button";
import { formatDateTime } from "@/lib/format/date-time";

/** The recordings with channel, name, samples, duration, rate, author and time; delete where allowed. */
export function RecordingsTable({ recordings, canDelete }: { recordings: RecordingSummary[]; canDelete: (r: RecordingSummary) => boolean }) {
  if (recordings.length === 0) {
    return <p className="px-4 py-4 text-sm text-slate-500">No recordings yet. Engineers upload CSV captures of a channel here to replay them through candidate filters.</p>;
  }
  const th = "px-3 py-2 text-left font-medium whitespace-nowrap";
  const td = "px-3 py-2 whitespace-nowrap";
  return (
    <div className="overflow-x-auto">
      <table className="w-full text-sm" data-testid="recordings-table">
        <thead className="bg-slate-50 text-xs text-slate-500 dark:bg-slate-900/60">
          <tr>
            <th className={th}>Name</th>
            <th className={th}>Channel</th>
            <th className={th}>Samples</th>
            <th className={th}>Duration</th>
            <th className={th}>Rate</th>
            <th className={th}>Author</th>
            <th className={th}>Uploaded</th>
            <th className={th} />
          </tr>
        </thead>
        <tbody>
          {recordings.map((r) => (
            <tr key={r.id} className="border-t border-slate-200 dark:border-slate-800" data-recording={r.id}>
              <td className={td}>
                <Link href={`/recordings/${r.id}`} className="font-medium text-brand-700 hover:underline dark:text-brand-300">
                  {r.name}
                </Link>
              </td>
              <td className={`${td} num text-xs`}>{r.channelPath}</td>
              <td className={`${td} num`}>
                {r.sampleCount.toLocaleString("en-US")}
                {r.missingCount > 0 && <span className="text-xs text-slate-500"> ({r.missingCount.toLocaleString("en-US")} missing)</span>}
              </td>
              <td className={`${td} num`}>{formatDuration(r.sampleCount / r.sampleRateHz)}</td>
              <td className={`${td} num`}>{formatHz(r.sampleRateHz, 6)}</td>
              <td className={td}>{r.authorName}</td>
              <td className={`${td} num text-xs`}>{formatDateTime(r.createdAt)}</td>
              <td className={td}>{canDelete(r) && <DeleteRecordingButton id={r.id} name={r.name} />}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
