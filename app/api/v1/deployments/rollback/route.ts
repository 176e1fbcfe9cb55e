import { requireUser } from "@/app/_lib/auth";
import { db } from "@/db";
import { requestRollback } from "@/db/workflow/deployments";
import { handler, parseBody } from "@/lib/http/handler";
import { rollbackSchema } from "../schema";

/** Puts the previously active revision back (no filter after a first promotion) through the acknowledged path (202; the ack decides). */
export const POST = handler(async (req) => {
  const user = await requireUser("lead");
  const body = await parseBody(req, rollbackSchema);
  const result = await db().transaction().execute((trx) => requestRollback(trx, user, body.channel, body.expectedActiveId));
  return Response.json(result, { status: 202 });
});
