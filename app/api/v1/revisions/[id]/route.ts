import { requireUser } from "@/app/_lib/auth";
import { db } from "@/db";
import { findRevision } from "@/db/queries/revisions";
import { AppError } from "@/lib/errors";
import { dbId } from "@/lib/http/fields";
import { handler, parseWith } from "@/lib/http/handler";

export const GET = handler(async (_req, ctx: { params: Promise<{ id: string }> }) => {
  const id = parseWith(dbId, (await ctx.params).id);
  await requireUser();
  const revision = await findRevision(db(), id);
  if (!revision) throw new AppError("not_found", "No such revision.");
  return Response.json(revision);
});
