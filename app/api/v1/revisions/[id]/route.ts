import { requireCaller } from "@/app/_lib/api-caller";
import { db } from "@/db";
import { findRevision } from "@/db/queries/revisions";
import { AppError } from "@/lib/errors";
import { handler, parseWith } from "@/lib/http/handler";
import { idParam } from "../../sets/schema";

export const GET = handler(async (req, ctx: { params: Promise<{ id: string }> }) => {
  const id = parseWith(idParam, (await ctx.params).id);
  await requireCaller(req, "operator");
  const revision = await findRevision(db(), id);
  if (!revision) throw new AppError("not_found", "No such revision.");
  return Response.json(revision);
});
