import type { Metadata } from "next";
import { z } from "zod";
import { requirePageUser } from "@/app/_lib/auth";
import { AlarmFeed } from "@/components/alarms/alarm-feed";
import { AlarmsBoard } from "@/components/alarms/alarms-board";
import { alarmRuleSchema } from "@/components/alarms/api";
import { RulesPanel } from "@/components/alarms/rules-panel";
import { AnnotationsPanel } from "@/components/annotations/annotations-panel";
import { db } from "@/db";
import { listAlarmRules } from "@/db/queries/alarm-rules";
import { listChannels } from "@/db/queries/channels";
import { roleAtLeast } from "@/lib/auth/roles";
import { env } from "@/lib/env";
import { ALARM_KINDS, ALARM_SEVERITIES, ALARM_STATES, channelPathSchema, KEY_PATTERN, WS_PATH } from "@/lib/protocol";

export const metadata: Metadata = { title: "Alarms" };

/** Filters from the address (a link from a channel card or the bench); anything unreadable is ignored. */
const filterSchema = z.object({
  channel: channelPathSchema.optional().catch(undefined),
  rig: z.string().regex(KEY_PATTERN).optional().catch(undefined),
  severity: z.enum(ALARM_SEVERITIES).optional().catch(undefined),
  kind: z.enum(ALARM_KINDS).optional().catch(undefined),
  state: z.enum(ALARM_STATES).optional().catch(undefined),
});

export default async function AlarmsPage(props: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const user = await requirePageUser();
  const initial = filterSchema.parse(await props.searchParams);
  const [channels, rules] = await Promise.all([listChannels(db()), listAlarmRules(db())]);
  const options = channels.map((c) => ({ path: c.path, name: c.name, unit: c.unit, rigKey: c.rigKey, rigName: c.rigName }));
  return (
    <AlarmFeed port={env().SIDECAR_PORT} wsPath={WS_PATH}>
      <div className="space-y-4">
        <div className="flex flex-wrap items-baseline gap-x-4">
          <h1 className="text-xl font-semibold">Alarms</h1>
          <p className="text-sm text-slate-500">Raised and cleared alarms of every rig, newest first; acknowledge each with what was done or seen.</p>
        </div>
        <AlarmsBoard channels={options} initial={initial} />
        <RulesPanel initial={z.array(alarmRuleSchema).parse(rules)} channels={options} canEdit={roleAtLeast(user.role, "engineer")} />
        <AnnotationsPanel channels={options} viewer={{ id: user.id, role: user.role }} />
      </div>
    </AlarmFeed>
  );
}
