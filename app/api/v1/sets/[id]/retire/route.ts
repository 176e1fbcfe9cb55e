import { requireUser } from "@/app/_lib/auth";
import { db } from "@/db";
import { retireSet } from "@/db/workflow/sets";
import { dbId } from "@/lib/http/fields";
import { handler, parseBody, parseWith } from "@/lib/http/handler";
import { retireSchema } from "../../schema";

export const POST = handler(async (req, ctx: { params: Promise<{ id: string }> }) => {
  const id = parseWith(dbId, (await ctx.params).id);
  const user = await requireUser("lead");
  const body = await parseBody(req, retireSchema);
  await db().transaction().execute((trx) => retireSet(trx, user, id, body.expectedVersion));
  return Response.json({ setId: id, status: "retired" });
});
