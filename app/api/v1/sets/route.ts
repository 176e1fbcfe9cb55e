import { requireCaller } from "@/app/_lib/api-caller";
import { requireUser } from "@/app/_lib/auth";
import { db } from "@/db";
import { findChannelByPath } from "@/db/queries/channels";
import { listSets } from "@/db/queries/sets";
import { createSet } from "@/db/workflow/sets";
import { AppError } from "@/lib/errors";
import { handler, parseBody, parseWith } from "@/lib/http/handler";
import { revisionInput } from "./content";
import { createSetSchema, listSetsSchema } from "./schema";

export const GET = handler(async (req) => {
  const filters = parseWith(listSetsSchema, Object.fromEntries(new URL(req.url).searchParams));
  await requireCaller(req, "operator");
  return Response.json(await listSets(db(), filters));
});

export const POST = handler(async (req) => {
  const user = await requireUser("engineer");
  const body = await parseBody(req, createSetSchema);
  const channel = await findChannelByPath(db(), body.channel);
  if (!channel) throw new AppError("not_found", `No channel ${body.channel}.`);
  const input = await revisionInput(body.spec, { path: channel.path, sampleRateHz: channel.sampleRateHz, format: channel.coefficientFormat }, body.notes, user.id);
  const saved = await db().transaction().execute((trx) => createSet(trx, user, channel.id, body.name, input));
  return Response.json(saved, { status: 201 });
});
