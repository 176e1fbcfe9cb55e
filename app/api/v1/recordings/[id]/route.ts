import { requireUser } from "@/app/_lib/auth";
import { db } from "@/db";
import { deleteRecording, findRecording } from "@/db/queries/recordings";
import { roleAtLeast } from "@/lib/auth/roles";
import { AppError } from "@/lib/errors";
import { dbId } from "@/lib/http/fields";
import { handler, parseWith } from "@/lib/http/handler";

type Ctx = { params: Promise<{ id: string }> };

export const GET = handler(async (_req, ctx: Ctx) => {
  const id = parseWith(dbId, (await ctx.params).id);
  await requireUser();
  const recording = await findRecording(db(), id);
  if (!recording) throw new AppError("not_found", "No such recording.");
  return Response.json(recording);
});

/** Its author or a lead may delete a recording. */
export const DELETE = handler(async (_req, ctx: Ctx) => {
  const id = parseWith(dbId, (await ctx.params).id);
  const user = await requireUser();
  const recording = await findRecording(db(), id);
  if (!recording) throw new AppError("not_found", "No such recording.");
  if (recording.createdBy !== user.id && !roleAtLeast(user.role, "lead")) throw new AppError("forbidden", "Only the recording's author or a lead may delete it.");
  const deleted = await db()
    .transaction()
    .execute((trx) => deleteRecording(trx, user, recording));
  if (!deleted) throw new AppError("not_found", "No such recording.");
  return new Response(null, { status: 204 });
});
