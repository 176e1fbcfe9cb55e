import { z } from "zod";
import { requireUser } from "@/app/_lib/auth";
import { db } from "@/db";
import { retireSet } from "@/db/queries/sets";
import { handler, parseBody, parseWith } from "@/lib/http/handler";
import { idParam } from "../../schema";

const retireSchema = z.object({ expectedVersion: z.number().int().min(1) });

export const POST = handler(async (req, ctx: { params: Promise<{ id: string }> }) => {
  const id = parseWith(idParam, (await ctx.params).id);
  const body = await parseBody(req, retireSchema);
  const user = await requireUser("lead");
  await db().transaction().execute((trx) => retireSet(trx, user, id, body.expectedVersion));
  return Response.json({ setId: id, status: "retired" });
});
