import { requireUser } from "@/app/_lib/auth";
import { db } from "@/db";
import { deleteAlarmRule, findAlarmRule, updateAlarmRule } from "@/db/queries/alarm-rules";
import { AppError } from "@/lib/errors";
import { handler, parseBody, parseWith } from "@/lib/http/handler";
import { idParam, mergedRuleSchema, patchRuleSchema } from "../schema";

type Ctx = { params: Promise<{ id: string }> };

const NOT_FOUND = "No such alarm rule.";

/** PATCH /api/v1/alarm-rules/{id}: change any fields, enable or disable (engineers and up); the whole result is checked and audited. */
export const PATCH = handler(async (req, ctx: Ctx) => {
  const user = await requireUser("engineer");
  const id = parseWith(idParam, (await ctx.params).id);
  const patch = await parseBody(req, patchRuleSchema);
  const before = await findAlarmRule(db(), id);
  if (!before) throw new AppError("not_found", NOT_FOUND);
  const next = parseWith(mergedRuleSchema, { ...pickFields(before), ...patch });
  const rule = await db()
    .transaction()
    .execute((trx) => updateAlarmRule(trx, user, before, next));
  if (!rule) throw new AppError("not_found", NOT_FOUND);
  return Response.json(rule);
});

/** DELETE /api/v1/alarm-rules/{id} (engineers and up): the rule stops; its events keep it in their history. */
export const DELETE = handler(async (_req, ctx: Ctx) => {
  const user = await requireUser("engineer");
  const id = parseWith(idParam, (await ctx.params).id);
  const rule = await findAlarmRule(db(), id);
  if (!rule) throw new AppError("not_found", NOT_FOUND);
  const deleted = await db()
    .transaction()
    .execute((trx) => deleteAlarmRule(trx, user, rule));
  if (!deleted) throw new AppError("not_found", NOT_FOUND);
  return new Response(null, { status: 204 });
});

function pickFields(r: NonNullable<Awaited<ReturnType<typeof findAlarmRule>>>) {
  return { name: r.name, signal: r.signal, high: r.high, low: r.low, deadband: r.deadband, minDurationMs: r.minDurationMs, severity: r.severity, enabled: r.enabled };
}
