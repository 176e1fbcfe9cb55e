import { requireCaller } from "@/app/_lib/api-caller";
import { db } from "@/db";
import { requestPromotion } from "@/db/workflow/deployments";
import { dbId } from "@/lib/http/fields";
import { handler, parseBody, parseWith } from "@/lib/http/handler";
import { promoteSchema } from "../../schema";

/**
 * Records pending deployments; the sidecar's worker sends them and the device's ack makes them active
 * (202). A lead's session, or a promote token of a lead (audited with the token's name).
 */
export const POST = handler(async (req, ctx: { params: Promise<{ id: string }> }) => {
  const caller = await requireCaller(req, "lead", "promote");
  const id = parseWith(dbId, (await ctx.params).id);
  const body = await parseBody(req, promoteSchema);
  const result = await db().transaction().execute((trx) => requestPromotion(trx, caller.user, id, body.channels, caller.token?.name));
  return Response.json(result, { status: 202 });
});
