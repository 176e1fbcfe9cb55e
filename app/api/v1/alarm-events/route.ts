import { requireUser } from "@/app/_lib/auth";
import { db } from "@/db";
import { listAlarmEvents } from "@/db/queries/alarm-events";
import { findChannelByPath } from "@/db/queries/channels";
import { AppError } from "@/lib/errors";
import { handler, parseWith } from "@/lib/http/handler";
import { listEventsSchema } from "./schema";

/** GET /api/v1/alarm-events?channel=&rig=&severity=&kind=&state=&from=&to=&limit=: stored alarm events, newest first. Any signed-in role. */
export const GET = handler(async (req) => {
  const { channel: path, ...filter } = parseWith(listEventsSchema, Object.fromEntries(new URL(req.url).searchParams));
  await requireUser();
  const channel = path ? await findChannelByPath(db(), path) : undefined;
  if (path && !channel) throw new AppError("not_found", `No channel ${path}.`);
  return Response.json(await listAlarmEvents(db(), { ...filter, channelId: channel?.id }), { headers: { "cache-control": "no-store" } });
});
