import { requireUser } from "@/app/_lib/auth";
import { db } from "@/db";
import { transitionRevision } from "@/db/workflow/review";
import { dbId } from "@/lib/http/fields";
import { handler, parseBody, parseWith } from "@/lib/http/handler";
import { transitionSchema } from "../../schema";

/** Submit, approve or reject; the body carries the state version the client saw (409 when stale). */
export const POST = handler(async (req, ctx: { params: Promise<{ id: string }> }) => {
  const id = parseWith(dbId, (await ctx.params).id);
  const user = await requireUser("engineer");
  const body = await parseBody(req, transitionSchema);
  const rev = await db().transaction().execute((trx) => transitionRevision(trx, user, { revisionId: id, ...body }));
  return Response.json({ revisionId: rev.id, state: rev.state, stateVersion: rev.stateVersion });
});
