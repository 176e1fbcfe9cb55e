import { requireCaller } from "@/app/_lib/api-caller";
import { db } from "@/db";
import { listChannels } from "@/db/queries/channels";
import { handler } from "@/lib/http/handler";

export const GET = handler(async (req) => {
  await requireCaller(req, "operator");
  const channels = await listChannels(db());
  return Response.json(
    channels.map((c) => ({ path: c.path, name: c.name, unit: c.unit, sampleRateHz: c.sampleRateHz })),
  );
});
