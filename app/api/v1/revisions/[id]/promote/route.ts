import { requireUser } from "@/app/_lib/auth";
import { db } from "@/db";
import { requestPromotion } from "@/db/queries/deployments";
import { dbId } from "@/lib/http/fields";
import { handler, parseBody, parseWith } from "@/lib/http/handler";
import { promoteSchema } from "../../schema";

/** Records pending deployments; the sidecar's worker sends them and the device's ack makes them active (202). */
export const POST = handler(async (req, ctx: { params: Promise<{ id: string }> }) => {
  const id = parseWith(dbId, (await ctx.params).id);
  const user = await requireUser("lead");
  const body = await parseBody(req, promoteSchema);
  const result = await db().transaction().execute((trx) => requestPromotion(trx, user, id, body.channels));
  return Response.json(result, { status: 202 });
});
