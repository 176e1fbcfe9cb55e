import { requireUser } from "@/app/_lib/auth";
import { db } from "@/db";
import { listChannels } from "@/db/queries/channels";
import { handler } from "@/lib/http/handler";

export const GET = handler(async () => {
  await requireUser();
  const channels = await listChannels(db());
  return Response.json(
    channels.map((c) => ({ path: c.path, name: c.name, unit: c.unit, sampleRateHz: c.sampleRateHz })),
  );
});
