import { requireUser } from "@/app/_lib/auth";
import { db } from "@/db";
import { deleteBenchCandidate, saveBenchCandidate } from "@/db/queries/bench-candidates";
import { findChannelByPath } from "@/db/queries/channels";
import { AppError } from "@/lib/errors";
import { handler, parseBody, parseWith } from "@/lib/http/handler";
import { candidateKeySchema, saveCandidateSchema } from "./schema";

type Ctx = { params: Promise<{ rig: string; device: string; channel: string; key: string }> };

/** The caller's channel and candidate key from the route; 404 for an unknown channel. */
async function target(ctx: Ctx) {
  const { rig, device, channel: channelKey, key } = await ctx.params;
  const path = `${rig}/${device}/${channelKey}`;
  const channel = await findChannelByPath(db(), path);
  if (!channel) throw new AppError("not_found", `No channel ${path}.`);
  return { channel, key: parseWith(candidateKeySchema, key) };
}

/** PUT …/candidates/{key} {spec, colorIndex}: keeps a candidate on the caller's bench of this channel (engineer and above). */
export const PUT = handler(async (req, ctx: Ctx) => {
  const user = await requireUser("engineer");
  const { channel, key } = await target(ctx);
  const body = await parseBody(req, saveCandidateSchema);
  if (body.spec.sampleRateHz !== channel.sampleRateHz) {
    throw new AppError("unprocessable", `The filter is designed for ${body.spec.sampleRateHz} Hz; this channel samples at ${channel.sampleRateHz} Hz.`);
  }
  const kept = await db()
    .transaction()
    .execute((trx) => saveBenchCandidate(trx, user.id, channel.id, { key, ...body }));
  return Response.json(kept);
});

/** DELETE …/candidates/{key}: removes it from the caller's bench (204 also when it was not kept). */
export const DELETE = handler(async (_req, ctx: Ctx) => {
  const user = await requireUser("engineer");
  const { channel, key } = await target(ctx);
  await deleteBenchCandidate(db(), user.id, channel.id, key);
  return new Response(null, { status: 204 });
});
