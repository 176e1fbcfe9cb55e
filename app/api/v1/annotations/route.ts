import { requireUser } from "@/app/_lib/auth";
import { db } from "@/db";
import { createAnnotation, listAnnotations } from "@/db/queries/annotations";
import { findChannelByPath } from "@/db/queries/channels";
import { AppError } from "@/lib/errors";
import { handler, parseBody, parseWith } from "@/lib/http/handler";
import { createAnnotationSchema, listAnnotationsSchema } from "./schema";

/** GET /api/v1/annotations?channel=&q=&from=&to=&limit=: newest first; every word of q must be in the text. Any signed-in role. */
export const GET = handler(async (req) => {
  const { channel: path, from, to, ...rest } = parseWith(listAnnotationsSchema, Object.fromEntries(new URL(req.url).searchParams));
  await requireUser();
  const channel = path ? await findChannelByPath(db(), path) : undefined;
  if (path && !channel) throw new AppError("not_found", `No channel ${path}.`);
  return Response.json(await listAnnotations(db(), { ...rest, channelId: channel?.id, from: from?.getTime(), to: to?.getTime() }));
});

/** POST /api/v1/annotations {channel, at, endAt?, text}: anyone signed in marks a moment or a span; audited. */
export const POST = handler(async (req) => {
  const user = await requireUser();
  const body = await parseBody(req, createAnnotationSchema);
  const channel = await findChannelByPath(db(), body.channel);
  if (!channel) throw new AppError("not_found", `No channel ${body.channel}.`, [{ path: "channel", message: "No such channel." }]);
  const saved = await db()
    .transaction()
    .execute((trx) => createAnnotation(trx, user, { channel: { id: channel.id, path: channel.path }, at: body.at, endAt: body.endAt, text: body.text }));
  return Response.json(saved, { status: 201 });
});
