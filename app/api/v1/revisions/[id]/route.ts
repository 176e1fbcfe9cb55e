import { requireCaller } from "@/app/_lib/api-caller";
import { db } from "@/db";
import { findRevision } from "@/db/queries/revisions";
import { AppError } from "@/lib/errors";
import { dbId } from "@/lib/http/fields";
import { handler, parseWith } from "@/lib/http/handler";

export const GET = handler(async (req, ctx: { params: Promise<{ id: string }> }) => {
  await requireCaller(req, "operator");
  const id = parseWith(dbId, (await ctx.params).id);
  const revision = await findRevision(db(), id);
  if (!revision) throw new AppError("not_found", "No such revision.");
  return Response.json(revision);
});
