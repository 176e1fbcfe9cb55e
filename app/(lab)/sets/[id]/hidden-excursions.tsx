import { Suspense } from "react";
import { listAlarmRules } from "@/db/queries/alarm-rules";
import { findChannelByPath } from "@/db/queries/channels";
import { deployedDesign, findActiveDeployment } from "@/db/queries/deployments";
import { findRecordingSamples, listRecordings } from "@/db/queries/recordings";
import { db } from "@/db";
import { checkFilter, type FilterCheck } from "@/lib/alarms";
import { designFilter, type FilterSpec } from "@/lib/dsp";
import { env } from "@/lib/env";
import { decodeSamples } from "@/lib/recordings/samples";

/** How long the live service may take to hand over its recent samples, ms. */
const SIDECAR_TIMEOUT_MS = 1_500;

/** The raw samples the live service holds for a channel (about the last 60 s), or null when it cannot be reached. */
async function recentSamples(path: string): Promise<{ samples: Float64Array; sampleRateHz: number } | null> {
  try {
    const res = await fetch(`http://127.0.0.1:${env().SIDECAR_PORT}/recent?channel=${encodeURIComponent(path)}`, { cache: "no-store", signal: AbortSignal.timeout(SIDECAR_TIMEOUT_MS) });
    if (!res.ok) return null;
    return { samples: decodeSamples(new Uint8Array(await res.arrayBuffer())), sampleRateHz: Number(res.headers.get("x-sample-rate-hz")) };
  } catch (err) {
    console.warn(`[hidden excursions] recent samples of ${path} not available: ${err instanceof Error ? err.message : String(err)}`);
    return null;
  }
}

interface Source {
  label: string;
  candidate: FilterCheck;
  production: FilterCheck | null;
}

const seconds = (n: number, fs: number) => `${(n / fs).toFixed(0)} s`;

/**
 * For a revision about to replace the production filter: how many excursions past the channel's
 * filtered-signal alarm limits it would have hidden (raw crossed, filtered did not) over the samples
 * the live service holds and over the channel's newest recording, beside the production filter's count.
 */
export function HiddenExcursions(props: { channelPath: string; spec: FilterSpec }) {
  return (
    <Suspense fallback={<p className="text-xs text-slate-500">Checking whether this filter would hide an alarm excursion…</p>}>
      <HiddenExcursionsCheck {...props} />
    </Suspense>
  );
}

async function HiddenExcursionsCheck({ channelPath, spec }: { channelPath: string; spec: FilterSpec }) {
  const channel = await findChannelByPath(db(), channelPath);
  if (!channel) return null;
  const rules = (await listAlarmRules(db(), { channelId: channel.id, enabledOnly: true })).filter((r) => r.signal === "filtered");
  if (rules.length === 0) {
    return <p className="text-xs text-slate-500" data-testid="hidden-excursions">No enabled alarm rule watches this channel&apos;s filtered signal, so this revision cannot hide an excursion from one.</p>;
  }
  const candidate = designFilter(spec);
  const active = await findActiveDeployment(db(), channel.id);
  const production = active ? deployedDesign(active) : null;
  const fs = channel.sampleRateHz;
  const sources: Source[] = [];
  const recent = await recentSamples(channel.path);
  if (recent && recent.samples.length > 0 && recent.sampleRateHz === fs) {
    sources.push({ label: `the last ${seconds(recent.samples.length, fs)} the live service holds`, candidate: checkFilter(rules, candidate, recent.samples, fs), production: production && checkFilter(rules, production, recent.samples, fs) });
  }
  const [newest] = await listRecordings(db(), channel.id);
  const recorded = newest && newest.sampleRateHz === fs ? await findRecordingSamples(db(), newest.id) : undefined;
  if (newest && recorded) {
    sources.push({ label: `the recording “${newest.name}” (${seconds(recorded.length, fs)})`, candidate: checkFilter(rules, candidate, recorded, fs), production: production && checkFilter(rules, production, recorded, fs) });
  }
  return (
    <div className="rounded-md border border-dashed border-fault/60 p-2 text-xs" data-testid="hidden-excursions">
      <p className="font-medium">Would this filter hide a fault?</p>
      {sources.length === 0 ? (
        <p className="text-slate-500">No samples to check against: the live service is not answering and {channel.path} has no recording.</p>
      ) : (
        <ul className="mt-1 space-y-0.5">
          {sources.map((s) => (
            <li key={s.label} data-masked={s.candidate.masked}>
              Over {s.label}: this revision would have hidden <span className={`num font-medium ${s.candidate.masked ? "text-fault" : ""}`}>{s.candidate.masked}</span>{" "}
              {s.candidate.masked === 1 ? "excursion" : "excursions"} past {rules.map((r) => `“${r.name}”`).join(", ")} and raised {s.candidate.caught} {s.candidate.caught === 1 ? "alarm" : "alarms"}
              {s.production && <> (the production filter: {s.production.masked} hidden, {s.production.caught} raised)</>}.
            </li>
          ))}
        </ul>
      )}
      <p className="mt-1 text-slate-500">
        A hidden excursion is one where the raw signal crossed a limit the filtered signal did not. Confirm with your team&apos;s review and the machine&apos;s safety documentation; local codes and licensed engineers decide.
      </p>
    </div>
  );
}
