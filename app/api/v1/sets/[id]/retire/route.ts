import { requireUser } from "@/app/_lib/auth";
import { db } from "@/db";
import { retireSet } from "@/db/queries/sets";
import { handler, parseBody, parseWith } from "@/lib/http/handler";
import { idParam, retireSchema } from "../../schema";

export const POST = handler(async (req, ctx: { params: Promise<{ id: string }> }) => {
  const id = parseWith(idParam, (await ctx.params).id);
  const body = await parseBody(req, retireSchema);
  const user = await requireUser("lead");
  await db().transaction().execute((trx) => retireSet(trx, user, id, body.expectedVersion));
  return Response.json({ setId: id, status: "retired" });
});
