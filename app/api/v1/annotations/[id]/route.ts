import { requireUser } from "@/app/_lib/auth";
import { db } from "@/db";
import { deleteAnnotation, findAnnotation } from "@/db/queries/annotations";
import { roleAtLeast } from "@/lib/auth/roles";
import { AppError } from "@/lib/errors";
import { handler, parseWith } from "@/lib/http/handler";
import { idParam } from "../schema";

/** DELETE /api/v1/annotations/{id}: its author or a lead; audited. */
export const DELETE = handler(async (_req, ctx: { params: Promise<{ id: string }> }) => {
  const user = await requireUser();
  const id = parseWith(idParam, (await ctx.params).id);
  const annotation = await findAnnotation(db(), id);
  if (!annotation) throw new AppError("not_found", "No such annotation.");
  if (annotation.createdBy !== user.id && !roleAtLeast(user.role, "lead")) throw new AppError("forbidden", "Only the annotation's author or a lead may delete it.");
  const deleted = await db()
    .transaction()
    .execute((trx) => deleteAnnotation(trx, user, annotation));
  if (!deleted) throw new AppError("not_found", "No such annotation.");
  return new Response(null, { status: 204 });
});
