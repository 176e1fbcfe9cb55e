import { requireCaller } from "@/app/_lib/api-caller";
import { db } from "@/db";
import { findChannelByPath } from "@/db/queries/channels";
import { findProductionDeployment } from "@/db/queries/deployments";
import { AppError } from "@/lib/errors";
import { handler } from "@/lib/http/handler";

/**
 * The channel's production filter: the revision its device acknowledged last. Three dynamic segments,
 * not `[...path]`, because Next allows nothing after a catch-all segment.
 */
export const GET = handler(async (req, ctx: { params: Promise<{ rig: string; device: string; channel: string }> }) => {
  const { rig, device, channel: key } = await ctx.params;
  const path = `${rig}/${device}/${key}`;
  await requireCaller(req, "operator");
  const channel = await findChannelByPath(db(), path);
  if (!channel) throw new AppError("not_found", `No channel ${path}.`);
  const active = await findProductionDeployment(db(), channel.id);
  if (!active) throw new AppError("not_found", `No production filter is active on ${path}.`);
  return Response.json({
    revisionId: active.revisionId,
    setId: active.setId,
    setName: active.setName,
    revision: active.revision,
    spec: active.spec,
    design: active.design,
    activatedAt: active.activatedAt,
    deploymentId: active.id,
    checksum: active.checksum,
  });
});
