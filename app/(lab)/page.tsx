import Link from "next/link";
import { requirePageUser } from "@/app/_lib/auth";
import { AlarmFeed } from "@/components/alarms/alarm-feed";
import { AlarmSlot } from "@/components/alarms/alarm-slot";
import { ChannelLive, type KnownRevision } from "@/components/overview/channel-live";
import { LiveBanner } from "@/components/overview/live-banner";
import { db } from "@/db";
import { listAlarmRules } from "@/db/queries/alarm-rules";
import { listChannels, type ChannelRow } from "@/db/queries/channels";
import { listActiveRevisions } from "@/db/queries/deployments";
import { env } from "@/lib/env";
import { formatHz } from "@/lib/format/units";
import { WS_PATH } from "@/lib/protocol";
import { LOST_BATCHES_MEANING } from "@/components/overview/format";

function groupByRig(channels: ChannelRow[]) {
  const rigs = new Map<string, { name: string; devices: Map<string, { name: string; channels: ChannelRow[] }> }>();
  for (const c of channels) {
    const rig = rigs.get(c.rigKey) ?? { name: c.rigName, devices: new Map() };
    rigs.set(c.rigKey, rig);
    const device = rig.devices.get(c.deviceKey) ?? { name: c.deviceName, channels: [] };
    rig.devices.set(c.deviceKey, device);
    device.channels.push(c);
  }
  return rigs;
}

/** Active revisions by id, so a card can name the production filter the sidecar reports and link its set. */
async function knownRevisions(): Promise<Record<string, KnownRevision>> {
  const active = await listActiveRevisions(db());
  return Object.fromEntries(active.map((d) => [String(d.revisionId), { setId: d.setId, setName: d.setName, revision: d.revision }]));
}

export default async function OverviewPage() {
  await requirePageUser();
  const [channels, revisions, rules] = await Promise.all([listChannels(db()), knownRevisions(), listAlarmRules(db(), { enabledOnly: true })]);
  const rigs = groupByRig(channels);
  const ruleCount = (path: string) => rules.filter((r) => r.channel === path).length;
  return (
    <AlarmFeed port={env().SIDECAR_PORT} wsPath={WS_PATH}>
      <div className="space-y-6">
        <div>
          <h1 className="text-xl font-semibold">Overview</h1>
          <p className="text-xs text-slate-500">Lost batches on a card: {LOST_BATCHES_MEANING}</p>
        </div>
        <LiveBanner />
        {rigs.size === 0 && <p className="text-sm text-slate-500">No rigs yet. An administrator adds rigs, devices and channels.</p>}
        {[...rigs].map(([rigKey, rig]) => (
          <section key={rigKey} className="card overflow-hidden" aria-label={rig.name}>
            <h2 className="border-b border-slate-200 px-4 py-2.5 font-medium dark:border-slate-800">
              {rig.name} <span className="num ml-2 text-xs text-slate-500">{rigKey}</span>
            </h2>
            {[...rig.devices].map(([deviceKey, device]) => (
              <div key={deviceKey} className="px-4 py-3">
                <h3 className="mb-2 text-sm font-medium text-slate-600 dark:text-slate-300">{device.name}</h3>
                <ul className="grid grid-cols-[repeat(auto-fit,minmax(17rem,1fr))] gap-2">
                  {device.channels.map((c) => (
                    <li key={c.path} data-channel={c.path} className="rounded-md border border-slate-200 px-3 py-2 dark:border-slate-800">
                      <Link href={`/channels/${c.path}`} className="group block">
                        <span className="block font-medium group-hover:text-brand-600">{c.name}</span>
                        <span className="num block text-xs text-slate-500">
                          {c.path} · {formatHz(c.sampleRateHz)} · {c.unit}
                        </span>
                      </Link>
                      <ChannelLive path={c.path} unit={c.unit} revisions={revisions} />
                      <AlarmSlot path={c.path} ruleCount={ruleCount(c.path)} />
                    </li>
                  ))}
                </ul>
              </div>
            ))}
          </section>
        ))}
      </div>
    </AlarmFeed>
  );
}
