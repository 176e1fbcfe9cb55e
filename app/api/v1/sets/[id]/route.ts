import { requireCaller } from "@/app/_lib/api-caller";
import { db } from "@/db";
import { listSetDeployments } from "@/db/queries/deployments";
import { listReviews, listRevisions } from "@/db/queries/revisions";
import { findSet } from "@/db/queries/sets";
import { AppError } from "@/lib/errors";
import { dbId } from "@/lib/http/fields";
import { handler, parseWith } from "@/lib/http/handler";

export const GET = handler(async (req, ctx: { params: Promise<{ id: string }> }) => {
  await requireCaller(req, "operator");
  const id = parseWith(dbId, (await ctx.params).id);
  const set = await findSet(db(), id);
  if (!set) throw new AppError("not_found", "No such coefficient set.");
  const [revisions, reviews, deployments] = await Promise.all([listRevisions(db(), id), listReviews(db(), id), listSetDeployments(db(), id)]);
  return Response.json({ set, revisions, reviews, deployments });
});
