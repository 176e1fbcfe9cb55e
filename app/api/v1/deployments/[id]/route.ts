import { requireCaller } from "@/app/_lib/api-caller";
import { db } from "@/db";
import { findDeployment } from "@/db/queries/deployments";
import { AppError } from "@/lib/errors";
import { dbId } from "@/lib/http/fields";
import { handler, parseWith } from "@/lib/http/handler";

/** One deployment with the exact config sent to the device (for polling its outcome). */
export const GET = handler(async (req, ctx: { params: Promise<{ id: string }> }) => {
  await requireCaller(req, "operator");
  const id = parseWith(dbId, (await ctx.params).id);
  const d = await findDeployment(db(), id);
  if (!d) throw new AppError("not_found", "No such deployment.");
  const { design: _d, spec: _s, ...rest } = d;
  return Response.json(rest);
});
