import { requireCaller } from "@/app/_lib/api-caller";
import { exportResponse, revisionSource } from "@/app/api/v1/revisions/[id]/export/respond";
import { exportQuerySchema, queryOf } from "@/app/api/v1/revisions/[id]/export/schema";
import { db } from "@/db";
import { findChannelByPath } from "@/db/queries/channels";
import { findProductionDeployment } from "@/db/queries/deployments";
import { findRevision } from "@/db/queries/revisions";
import { AppError } from "@/lib/errors";
import { handler, parseWith } from "@/lib/http/handler";

/**
 * GET /api/v1/channels/{rig}/{device}/{channel}/production/export?format=…&target=… — the revision
 * the channel's device acknowledged last, by default in the format it was deployed in.
 */
export const GET = handler(async (req, ctx: { params: Promise<{ rig: string; device: string; channel: string }> }) => {
  const { rig, device, channel: key } = await ctx.params;
  const path = `${rig}/${device}/${key}`;
  const query = parseWith(exportQuerySchema, queryOf(req));
  const { user: caller } = await requireCaller(req, "operator");
  const channel = await findChannelByPath(db(), path);
  if (!channel) throw new AppError("not_found", `No channel ${path}.`);
  const active = await findProductionDeployment(db(), channel.id);
  if (!active) throw new AppError("not_found", `Nothing is in production on ${path}: no deployment is active.`);
  const revision = await findRevision(db(), active.revisionId);
  if (!revision) throw new AppError("not_found", "The active revision no longer exists.");
  const source = { ...(await revisionSource(revision, active.channel)), deployment: { id: active.id, checksum: active.checksum } };
  return exportResponse(source, query, active.format, caller);
});
