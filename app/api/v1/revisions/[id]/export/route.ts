import { requireCaller } from "@/app/_lib/api-caller";
import { db } from "@/db";
import { findRevision } from "@/db/queries/revisions";
import { AppError } from "@/lib/errors";
import { dbId } from "@/lib/http/fields";
import { handler, parseWith } from "@/lib/http/handler";
import { exportResponse, revisionSource } from "./respond";
import { exportQuerySchema, queryOf } from "./schema";

/** GET /api/v1/revisions/{id}/export?format=c-header|json|scipy&target=f32|q15|q31 — session or Bearer token. */
export const GET = handler(async (req, ctx: { params: Promise<{ id: string }> }) => {
  const id = parseWith(dbId, (await ctx.params).id);
  const query = parseWith(exportQuerySchema, queryOf(req));
  const { user: caller } = await requireCaller(req, "operator");
  const revision = await findRevision(db(), id);
  if (!revision) throw new AppError("not_found", "No such revision.");
  return exportResponse(await revisionSource(revision), query, revision.format, caller);
});
