import { requireCaller } from "@/app/_lib/api-caller";
import { db } from "@/db";
import { findChannelByPath } from "@/db/queries/channels";
import { listChannelDeployments } from "@/db/queries/deployments";
import { AppError } from "@/lib/errors";
import { handler, parseWith } from "@/lib/http/handler";
import { listDeploymentsSchema } from "./schema";

/** The deployment history of one channel, newest first. */
export const GET = handler(async (req) => {
  const { channel: path } = parseWith(listDeploymentsSchema, Object.fromEntries(new URL(req.url).searchParams));
  await requireCaller(req, "operator");
  const channel = await findChannelByPath(db(), path);
  if (!channel) throw new AppError("not_found", `No channel ${path}.`);
  const items = await listChannelDeployments(db(), channel.id);
  return Response.json({ items });
});
