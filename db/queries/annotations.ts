import type { Transaction } from "kysely";
import type { SessionUser } from "@/lib/auth/guard";
import type { Db } from "../client";
import type { Database } from "../types";
import { appendAudit } from "./audit";
import { channelPathSql } from "./channels";
import { escapeLike } from "./sets";


export interface AnnotationView {
  id: number;
  channel: string;
  at: Date;
  endAt: Date | null;
  text: string;
  createdBy: number;
  authorName: string;
  createdAt: Date;
}

export interface AnnotationFilter {
  channelId?: number;
  /** Words the text must contain (case-insensitive). */
  q?: string;
  /** Annotations that reach into [from, to), epoch ms. */
  from?: number;
  to?: number;
  limit: number;
}

function annotationQuery(db: Db) {
  return db
    .selectFrom("annotations as n")
    .innerJoin("channels as c", "c.id", "n.channel_id")
    .innerJoin("devices as d", "d.id", "c.device_id")
    .innerJoin("rigs as r", "r.id", "d.rig_id")
    .innerJoin("users as u", "u.id", "n.created_by")
    .select([
      "n.id",
      channelPathSql("r", "d", "c").as("channel"),
      "n.at",
      "n.end_at as endAt",
      "n.text",
      "n.created_by as createdBy",
      "u.display_name as authorName",
      "n.created_at as createdAt",
    ]);
}

/** Newest moment first; every word of `q` must appear in the text. */
export function listAnnotations(db: Db, f: AnnotationFilter): Promise<AnnotationView[]> {
  let q = annotationQuery(db);
  if (f.channelId !== undefined) q = q.where("n.channel_id", "=", f.channelId);
  for (const word of f.q?.split(/\s+/).filter(Boolean) ?? []) q = q.where("n.text", "ilike", `%${escapeLike(word)}%`);
  if (f.from !== undefined) {
    const from = new Date(f.from);
    q = q.where((eb) => eb.or([eb("n.at", ">=", from), eb("n.end_at", ">", from)]));
  }
  if (f.to !== undefined) q = q.where("n.at", "<", new Date(f.to));
  return q.orderBy("n.at", "desc").orderBy("n.id", "desc").limit(f.limit).execute();
}

export function findAnnotation(db: Db, id: number): Promise<AnnotationView | undefined> {
  return annotationQuery(db).where("n.id", "=", id).executeTakeFirst();
}

const auditView = (a: { channel: string; at: Date; endAt: Date | null; text: string }) => ({ channel: a.channel, at: a.at, endAt: a.endAt, text: a.text });

/** Stores an annotation with its audit entry; run it inside the caller's transaction. */
export async function createAnnotation(
  trx: Transaction<Database>,
  actor: SessionUser,
  input: { channel: { id: number; path: string }; at: Date; endAt: Date | null; text: string },
): Promise<AnnotationView> {
  const { id } = await trx
    .insertInto("annotations")
    .values({ channel_id: input.channel.id, at: input.at, end_at: input.endAt, text: input.text, created_by: actor.id })
    .returning("id")
    .executeTakeFirstOrThrow();
  await appendAudit(trx, { actorId: actor.id, action: "annotation.create", entity: "annotation", entityId: id, after: auditView({ ...input, channel: input.channel.path }) });
  return (await findAnnotation(trx, id))!;
}

/** Deletes an annotation with its audit entry; false when it was already gone. */
export async function deleteAnnotation(trx: Transaction<Database>, actor: SessionUser, a: AnnotationView): Promise<boolean> {
  const gone = await trx.deleteFrom("annotations").where("id", "=", a.id).executeTakeFirst();
  if (gone.numDeletedRows === BigInt(0)) return false;
  await appendAudit(trx, { actorId: actor.id, action: "annotation.delete", entity: "annotation", entityId: a.id, before: auditView(a) });
  return true;
}
