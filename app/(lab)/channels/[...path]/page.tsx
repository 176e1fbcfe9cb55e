import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { requirePageUser } from "@/app/_lib/auth";
import { channelPathOf } from "@/app/_lib/path";
import { BenchAlarms } from "@/components/alarms/bench-alarms";
import { Bench } from "@/components/bench/bench";
import { db } from "@/db";
import { listBenchCandidates } from "@/db/queries/bench-candidates";
import { findChannelByPath } from "@/db/queries/channels";
import { roleAtLeast } from "@/lib/auth/roles";
import { env } from "@/lib/env";
import { formatHz } from "@/lib/format/units";
import { WS_PATH } from "@/lib/protocol";


type Params = { params: Promise<{ path: string[] }> };

export async function generateMetadata({ params }: Params): Promise<Metadata> {
  const { path } = await params;
  return { title: `Bench · ${path.join("/")}` };
}

export default async function ChannelBenchPage({ params }: Params) {
  const user = await requirePageUser();
  const { path } = await params;
  const channelPath = channelPathOf(path);
  const channel = channelPath === null ? undefined : await findChannelByPath(db(), channelPath);
  if (!channel) notFound();
  const canEdit = roleAtLeast(user.role, "engineer");
  const kept = canEdit ? await listBenchCandidates(db(), user.id, channel.id) : [];
  return (
    <div className="space-y-4 lg:has-[[data-editing]]:pr-[29rem]">
      <div className="flex flex-wrap items-baseline gap-x-4 gap-y-1">
        <h1 className="text-xl font-semibold">{channel.name}</h1>
        <p className="num text-sm text-slate-500">
          <Link href="/" className="hover:underline">
            {channel.rigName}
          </Link>{" "}
          / {channel.deviceName} · {channel.path} · {formatHz(channel.sampleRateHz)} · {channel.unit} · device format {channel.coefficientFormat.toUpperCase()}
        </p>
        {canEdit && (
          <nav className="ml-auto flex gap-2 text-sm" aria-label="Channel tools">
            <Link href={`/loop/${channel.path}`} className="btn-quiet">Loop check</Link>
          </nav>
        )}
        {!canEdit && <p className="text-sm text-slate-500">You are watching as an operator: the live traces and the production filter are shown; trying filters needs the engineer role.</p>}
      </div>
      <BenchAlarms channel={{ path: channel.path, name: channel.name }} viewer={{ id: user.id, role: user.role }} port={env().SIDECAR_PORT} wsPath={WS_PATH}>
      <Bench
        channel={{ path: channel.path, name: channel.name, unit: channel.unit, sampleRateHz: channel.sampleRateHz, coefficientFormat: channel.coefficientFormat }}
        canEdit={canEdit}
        kept={kept.map((k) => ({ id: k.key, colorIndex: k.colorIndex, spec: k.spec, visible: true }))}
        sidecarPort={env().SIDECAR_PORT}
        wsPath={WS_PATH}
      />
      </BenchAlarms>
    </div>
  );
}
