import { requireUser } from "@/app/_lib/auth";
import { db } from "@/db";
import { countChannelRulesLocked, createAlarmRule, listAlarmRules, MAX_RULES_PER_CHANNEL } from "@/db/queries/alarm-rules";
import { findChannelByPath } from "@/db/queries/channels";
import { AppError } from "@/lib/errors";
import { handler, parseBody, parseWith } from "@/lib/http/handler";
import { createRuleSchema, listRulesSchema } from "./schema";

/** GET /api/v1/alarm-rules[?channel=]: every rule (one channel's when asked). Any signed-in role. */
export const GET = handler(async (req) => {
  const query = parseWith(listRulesSchema, Object.fromEntries(new URL(req.url).searchParams));
  await requireUser();
  const channel = query.channel ? await findChannelByPath(db(), query.channel) : undefined;
  if (query.channel && !channel) throw new AppError("not_found", `No channel ${query.channel}.`);
  return Response.json(await listAlarmRules(db(), { channelId: channel?.id }));
});

/** POST /api/v1/alarm-rules: a new rule on a channel (engineers and up), audited; the sidecar picks it up at once. */
export const POST = handler(async (req) => {
  const user = await requireUser("engineer");
  const { channel: path, ...input } = await parseBody(req, createRuleSchema);
  const channel = await findChannelByPath(db(), path);
  if (!channel) throw new AppError("not_found", `No channel ${path}.`, [{ path: "channel", message: "No such channel." }]);
  const rule = await db()
    .transaction()
    .execute(async (trx) => {
      if ((await countChannelRulesLocked(trx, channel.id)) >= MAX_RULES_PER_CHANNEL) {
        throw new AppError("conflict", `${path} already has ${MAX_RULES_PER_CHANNEL} rules, the most a channel may carry. Delete one first.`);
      }
      return createAlarmRule(trx, user, { id: channel.id, path: channel.path }, input);
    });
  return Response.json(rule, { status: 201 });
});
