import { requireUser } from "@/app/_lib/auth";
import { db } from "@/db";
import { channelOwners } from "@/db/queries/leases";
import { handler, parseWith } from "@/lib/http/handler";
import { ownerQuerySchema } from "./schema";

export const dynamic = "force-dynamic";

/**
 * GET /api/v1/live/owner?channel=: the WebSocket URL of the sidecar filtering the channel now (its
 * unexpired lease), or null with one sidecar (the page's default). Any signed-in role.
 */
export const GET = handler(async (req) => {
  await requireUser();
  const { channel } = parseWith(ownerQuerySchema, Object.fromEntries(new URL(req.url).searchParams));
  const owner = (await channelOwners(db())).get(channel);
  return Response.json({ channel, wsUrl: owner?.wsUrl ?? null }, { headers: { "cache-control": "no-store" } });
});
