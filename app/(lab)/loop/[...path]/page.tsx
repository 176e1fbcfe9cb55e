import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { requirePageUser } from "@/app/_lib/auth";
import { channelPathOf } from "@/app/_lib/path";
import { LoopCheck } from "@/components/loop/loop-check";
import { db } from "@/db";
import { findChannelByPath } from "@/db/queries/channels";
import { formatHz } from "@/lib/format/units";

type Params = { params: Promise<{ path: string[] }> };

export async function generateMetadata({ params }: Params): Promise<Metadata> {
  const { path } = await params;
  return { title: `Loop check · ${path.join("/")}` };
}

/** The loop check of a channel: what a sensor filter does to the control loop it sits in (engineers and above). */
export default async function LoopCheckPage({ params }: Params) {
  await requirePageUser("engineer");
  const { path } = await params;
  const channelPath = channelPathOf(path);
  const channel = channelPath === null ? undefined : await findChannelByPath(db(), channelPath);
  if (!channel) notFound();
  return (
    <div className="space-y-4">
      <div className="flex flex-wrap items-baseline gap-x-4 gap-y-1">
        <h1 className="text-xl font-semibold">Loop check · {channel.name}</h1>
        <p className="num text-sm text-slate-500">
          <Link href={`/channels/${channel.path}`} className="hover:underline">
            {channel.path}
          </Link>{" "}
          · {formatHz(channel.sampleRateHz)} · {channel.unit}
        </p>
      </div>
      <p className="max-w-3xl text-sm text-slate-600 dark:text-slate-300">
        The loop is modelled at the channel&apos;s sample rate: the plant through a zero-order hold, the controller, a computation delay, and the sensor filter in the measurement path. Compare the loop with and without the filter before it goes near the machine.
      </p>
      <LoopCheck channel={{ path: channel.path, name: channel.name, sampleRateHz: channel.sampleRateHz }} />
    </div>
  );
}
