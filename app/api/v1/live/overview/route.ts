import { requireUser } from "@/app/_lib/auth";
import { db } from "@/db";
import { liveSidecars } from "@/db/queries/leases";
import { liveOverviewSchema, localSidecarWsUrl, mergeOverviews, sidecarHttpUrl, type LiveOverview } from "@/lib/protocol";
import { env } from "@/lib/env";
import { AppError } from "@/lib/errors";
import { handler } from "@/lib/http/handler";

export const dynamic = "force-dynamic";

/** How long the sidecar may take before the live service counts as down, ms. */
const SIDECAR_TIMEOUT_MS = 1_500;

const DOWN = "The live service is not running or not answering. Start the sidecar (node --import tsx server/main.ts) and reload.";

/** A sidecar's live state of its channels, from its /overview; 503 when it cannot be reached or answers badly. */
async function sidecarOverview(url: string): Promise<LiveOverview> {
  let res: Response;
  try {
    res = await fetch(url, { cache: "no-store", signal: AbortSignal.timeout(SIDECAR_TIMEOUT_MS) });
  } catch {
    throw new AppError("unavailable", DOWN);
  }
  const parsed = liveOverviewSchema.safeParse(res.ok ? await res.json().catch(() => null) : null);
  if (!parsed.success) throw new AppError("unavailable", DOWN);
  return parsed.data;
}

/**
 * GET /api/v1/live/overview: online state, last sample, production revision, sparkline and faults of
 * every channel, from the one sidecar or merged from every live partitioned sidecar. Any signed-in role.
 */
export const GET = handler(async () => {
  await requireUser();
  const e = env();
  const sidecars = await liveSidecars(db(), e.LEASE_TTL_MS);
  const urls = (sidecars.length ? sidecars.map((s) => s.wsUrl) : [localSidecarWsUrl(e.SIDECAR_PORT)]).map((ws) => sidecarHttpUrl(ws, "/overview"));
  // A sidecar that just died is listed until its heartbeat ages out: the others' channels still show.
  const answers = await Promise.allSettled(urls.map(sidecarOverview));
  const parts = answers.flatMap((a) => (a.status === "fulfilled" ? [a.value] : []));
  if (!parts.length) throw new AppError("unavailable", DOWN);
  const overview = mergeOverviews(parts);
  return Response.json(overview, { headers: { "cache-control": "no-store" } });
});
