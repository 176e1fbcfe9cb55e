import { requireUser } from "@/app/_lib/auth";
import { liveOverviewSchema, type LiveOverview } from "@/lib/protocol";
import { env } from "@/lib/env";
import { AppError } from "@/lib/errors";
import { handler } from "@/lib/http/handler";

export const dynamic = "force-dynamic";

/** How long the sidecar may take before the live service counts as down, ms. */
const SIDECAR_TIMEOUT_MS = 1_500;

const DOWN = "The live service is not running or not answering. Start the sidecar (node --import tsx server/main.ts) and reload.";

/** The sidecar's lab-wide live state, from its loopback /overview; 503 when it cannot be reached or answers badly. */
async function sidecarOverview(port: number): Promise<LiveOverview> {
  let res: Response;
  try {
    res = await fetch(`http://127.0.0.1:${port}/overview`, { cache: "no-store", signal: AbortSignal.timeout(SIDECAR_TIMEOUT_MS) });
  } catch {
    throw new AppError("unavailable", DOWN);
  }
  const parsed = liveOverviewSchema.safeParse(res.ok ? await res.json().catch(() => null) : null);
  if (!parsed.success) throw new AppError("unavailable", DOWN);
  return parsed.data;
}

/** GET /api/v1/live/overview: online state, last sample, production revision, sparkline and faults of every channel. Any signed-in role. */
export const GET = handler(async () => {
  await requireUser();
  const overview = await sidecarOverview(env().SIDECAR_PORT);
  return Response.json(overview, { headers: { "cache-control": "no-store" } });
});
