import { requireUser } from "@/app/_lib/auth";
import { db } from "@/db";
import { addRevision, findSet } from "@/db/queries/sets";
import { AppError } from "@/lib/errors";
import { handler, parseBody, parseWith } from "@/lib/http/handler";
import { revisionInput } from "../../content";
import { addRevisionSchema, idParam } from "../../schema";

export const POST = handler(async (req, ctx: { params: Promise<{ id: string }> }) => {
  const id = parseWith(idParam, (await ctx.params).id);
  const body = await parseBody(req, addRevisionSchema);
  const user = await requireUser("engineer");
  const set = await findSet(db(), id);
  if (!set) throw new AppError("not_found", "No such coefficient set.");
  const input = revisionInput(body.spec, { path: set.channel, sampleRateHz: set.sampleRateHz, format: set.format }, body.notes);
  const saved = await db().transaction().execute((trx) => addRevision(trx, user, id, body.expectedLatestRevision, input));
  return Response.json(saved, { status: 201 });
});
