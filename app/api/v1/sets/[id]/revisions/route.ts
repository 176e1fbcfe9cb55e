import { requireUser } from "@/app/_lib/auth";
import { db } from "@/db";
import { findSet } from "@/db/queries/sets";
import { addRevision } from "@/db/workflow/sets";
import { AppError } from "@/lib/errors";
import { dbId } from "@/lib/http/fields";
import { handler, parseBody, parseWith } from "@/lib/http/handler";
import { revisionInput } from "../../content";
import { addRevisionSchema } from "../../schema";

export const POST = handler(async (req, ctx: { params: Promise<{ id: string }> }) => {
  const id = parseWith(dbId, (await ctx.params).id);
  const user = await requireUser("engineer");
  const body = await parseBody(req, addRevisionSchema);
  const set = await findSet(db(), id);
  if (!set) throw new AppError("not_found", "No such coefficient set.");
  const input = await revisionInput(body.spec, { path: set.channel, sampleRateHz: set.sampleRateHz, format: set.format }, body.notes, user.id);
  const saved = await db().transaction().execute((trx) => addRevision(trx, user, id, body.expectedLatestRevision, input));
  return Response.json(saved, { status: 201 });
});
