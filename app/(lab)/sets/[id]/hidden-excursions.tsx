import { Suspense } from "react";
import { listAlarmRules } from "@/db/queries/alarm-rules";
import { findChannelByPath } from "@/db/queries/channels";
import { findActiveDeployment } from "@/db/queries/deployments";
import { channelOwners } from "@/db/queries/leases";
import { deployedDesign } from "@/lib/coefficients";
import { findRecordingSamples, listRecordings } from "@/db/queries/recordings";
import { db } from "@/db";
import type { AlarmRule, FilterCheck } from "@/lib/alarms";
import type { FilterDesign, FilterSpec } from "@/lib/dsp";
import { env } from "@/lib/env";
import { localSidecarWsUrl, sidecarHttpUrl } from "@/lib/protocol";
import { decodeSamples } from "@/lib/recordings/samples";
import { computeForRequest } from "@/lib/workers";
import { errorMessage } from "@/lib/errors";
import { countOf } from "@/lib/format/plural";

/** How long the live service may take to hand over its recent samples, ms. */
const SIDECAR_TIMEOUT_MS = 1_500;

/**
 * The raw samples the live service holds for a channel (about the last 60 s), or null when it cannot be
 * reached: asked of the sidecar that owns the channel when sidecars are partitioned (its lease), else of
 * the one sidecar.
 */
async function recentSamples(path: string): Promise<{ samples: Float64Array; sampleRateHz: number } | null> {
  try {
    const owner = (await channelOwners(db())).get(path);
    const url = sidecarHttpUrl(owner?.wsUrl ?? localSidecarWsUrl(env().SIDECAR_PORT), "/recent", { channel: path });
    const res = await fetch(url, { cache: "no-store", signal: AbortSignal.timeout(SIDECAR_TIMEOUT_MS) });
    if (!res.ok) return null;
    return { samples: decodeSamples(new Uint8Array(await res.arrayBuffer())), sampleRateHz: Number(res.headers.get("x-sample-rate-hz")) };
  } catch (err) {
    console.warn(`[hidden excursions] recent samples of ${path} not available: ${errorMessage(err)}`);
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
interface CheckProps {
  channelPath: string;
  spec: FilterSpec;
  /** Whose request the check runs for (the work pool's per-user share). */
  owner: string;
}

export function HiddenExcursions(props: CheckProps) {
  return (
    <Suspense fallback={<p className="text-xs text-slate-500">Checking whether this filter would hide an alarm excursion…</p>}>
      <HiddenExcursionsCheck {...props} />
    </Suspense>
  );
}

/** The candidate and the production filter over some samples, on the web app's work threads (bounded in time). */
async function check(rules: AlarmRule[], props: CheckProps, production: FilterDesign | null, samples: Float64Array, sampleRateHz: number) {
  return computeForRequest({ kind: "filter-check", rules, candidate: props.spec, production, samples, sampleRateHz }, props.owner, "The check could not be made");
}

async function HiddenExcursionsCheck(props: CheckProps) {
  const { channelPath } = props;
  const channel = await findChannelByPath(db(), channelPath);
  if (!channel) return null;
  const rules: AlarmRule[] = (await listAlarmRules(db(), { channelId: channel.id, enabledOnly: true }))
    .filter((r) => r.signal === "filtered")
    .map(({ id, channel: path, name, signal, high, low, deadband, minDurationMs, severity, enabled }) => ({ id, channel: path, name, signal, high, low, deadband, minDurationMs, severity, enabled }));
  if (rules.length === 0) {
    return <p className="text-xs text-slate-500" data-testid="hidden-excursions">No enabled alarm rule watches this channel&apos;s filtered signal, so this revision cannot hide an excursion from one.</p>;
  }
  const active = await findActiveDeployment(db(), channel.id);
  const production = active ? deployedDesign(active) : null;
  const fs = channel.sampleRateHz;
  const sources: Source[] = [];
  const failures: string[] = [];
  const add = async (label: string, samples: Float64Array) => {
    try {
      sources.push({ label, ...(await check(rules, props, production, samples, fs)) });
    } catch (err) {
      console.warn(`[hidden excursions] ${channel.path} over ${label}: ${errorMessage(err)}`);
      failures.push(err instanceof Error ? err.message : "The check could not be made.");
    }
  };
  const recent = await recentSamples(channel.path);
  if (recent && recent.samples.length > 0 && recent.sampleRateHz === fs) await add(`the last ${seconds(recent.samples.length, fs)} the live service holds`, recent.samples);
  const [newest] = await listRecordings(db(), channel.id);
  const recorded = newest && newest.sampleRateHz === fs ? await findRecordingSamples(db(), newest.id) : undefined;
  if (newest && recorded) await add(`the recording “${newest.name}” (${seconds(recorded.length, fs)})`, recorded);
  const failure = failures.at(-1) ?? null;
  return (
    <div className="rounded-md border border-dashed border-fault/60 p-2 text-xs" data-testid="hidden-excursions">
      <p className="font-medium">Would this filter hide a fault?</p>
      {failure && <p className="text-fault">{failure}</p>}
      {sources.length === 0 ? (
        !failure && <p className="text-slate-500">No samples to check against: the live service is not answering and {channel.path} has no recording.</p>
      ) : (
        <ul className="mt-1 space-y-0.5">
          {sources.map((s) => (
            <li key={s.label} data-masked={s.candidate.masked}>
              Over {s.label}: this revision would have hidden <span className={`num font-medium ${s.candidate.masked ? "text-fault" : ""}`}>{s.candidate.masked}</span>{" "}
              {s.candidate.masked === 1 ? "excursion" : "excursions"} past {rules.map((r) => `“${r.name}”`).join(", ")} and raised {countOf(s.candidate.caught, "alarm")}
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
