import { requireUser } from "@/app/_lib/auth";
import { db } from "@/db";
import { acknowledgeAlarmEvent, findAlarmEvent } from "@/db/queries/alarm-events";
import { AppError } from "@/lib/errors";
import { handler, parseBody, parseWith } from "@/lib/http/handler";
import { acknowledgeSchema, eventIdParam } from "../../schema";

/** POST /api/v1/alarm-events/{id}/acknowledge {comment}: operators and up; audited and pushed to every open browser. */
export const POST = handler(async (req, ctx: { params: Promise<{ id: string }> }) => {
  const user = await requireUser("operator");
  const id = parseWith(eventIdParam, (await ctx.params).id);
  const { comment } = await parseBody(req, acknowledgeSchema);
  const event = await findAlarmEvent(db(), id);
  if (!event) throw new AppError("not_found", "No such alarm event (an alarm raised while the database was down is stored once it is back).");
  if (event.acknowledgedAt) throw new AppError("conflict", `${event.acknowledgedBy ?? "Someone"} acknowledged this alarm already.`);
  const acknowledged = await db()
    .transaction()
    .execute((trx) => acknowledgeAlarmEvent(trx, user, id, comment));
  if (!acknowledged) throw new AppError("conflict", "Someone acknowledged this alarm a moment ago.");
  return Response.json(acknowledged);
});
