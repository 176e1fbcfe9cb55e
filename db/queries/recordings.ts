import type { Transaction } from "kysely";
import type { SessionUser } from "@/lib/auth/guard";
import { decodeSamples, encodeSamples } from "@/lib/recordings";
import type { RecordingSummary } from "@/lib/recordings/summary";
import type { Db } from "../client";
import type { Database } from "../types";
import { appendAudit } from "./audit";
import { channelPathSql } from "./channels";


export type { RecordingSummary };

export interface NewRecording {
  channelId: number;
  name: string;
  notes: string;
  sampleRateHz: number;
  startedAt: Date | null;
  samples: Float64Array;
  missingCount: number;
}

function summaryQuery(db: Db) {
  return db
    .selectFrom("recordings as rec")
    .innerJoin("channels as c", "c.id", "rec.channel_id")
    .innerJoin("devices as d", "d.id", "c.device_id")
    .innerJoin("rigs as r", "r.id", "d.rig_id")
    .innerJoin("users as u", "u.id", "rec.created_by")
    .select([
      "rec.id",
      channelPathSql("r", "d", "c").as("channelPath"),
      "c.name as channelName",
      "c.unit",
      "rec.name",
      "rec.notes",
      "rec.sample_rate_hz as sampleRateHz",
      "rec.sample_count as sampleCount",
      "rec.missing_count as missingCount",
      "rec.started_at as startedAt",
      "rec.source",
      "rec.created_by as createdBy",
      "u.display_name as authorName",
      "rec.created_at as createdAt",
    ]);
}

/** Newest first; only one channel's when `channelId` is given. */
export function listRecordings(db: Db, channelId?: number): Promise<RecordingSummary[]> {
  let q = summaryQuery(db);
  if (channelId !== undefined) q = q.where("rec.channel_id", "=", channelId);
  return q.orderBy("rec.created_at", "desc").orderBy("rec.id", "desc").execute();
}

export function findRecording(db: Db, id: number): Promise<RecordingSummary | undefined> {
  return summaryQuery(db).where("rec.id", "=", id).executeTakeFirst();
}

/** The samples of a recording, or undefined when there is none with this id. */
export async function findRecordingSamples(db: Db, id: number): Promise<Float64Array | undefined> {
  const row = await db.selectFrom("recordings").select("samples").where("id", "=", id).executeTakeFirst();
  return row ? decodeSamples(row.samples) : undefined;
}

/** Stores a recording with its audit entry; run it inside the caller's transaction. */
export async function createRecording(trx: Transaction<Database>, actor: SessionUser, input: NewRecording): Promise<RecordingSummary> {
  const { id } = await trx
    .insertInto("recordings")
    .values({
      channel_id: input.channelId,
      name: input.name,
      notes: input.notes,
      sample_rate_hz: input.sampleRateHz,
      started_at: input.startedAt,
      sample_count: input.samples.length,
      missing_count: input.missingCount,
      samples: encodeSamples(input.samples),
      created_by: actor.id,
    })
    .returning("id")
    .executeTakeFirstOrThrow();
  const saved = (await findRecording(trx, id))!;
  await appendAudit(trx, { actorId: actor.id, action: "recording.create", entity: "recording", entityId: id, after: auditView(saved) });
  return saved;
}

/** Deletes a recording with its audit entry; false when it did not exist. */
export async function deleteRecording(trx: Transaction<Database>, actor: SessionUser, recording: RecordingSummary): Promise<boolean> {
  const gone = await trx.deleteFrom("recordings").where("id", "=", recording.id).executeTakeFirst();
  if (gone.numDeletedRows === BigInt(0)) return false;
  await appendAudit(trx, { actorId: actor.id, action: "recording.delete", entity: "recording", entityId: recording.id, before: auditView(recording) });
  return true;
}

function auditView(r: RecordingSummary) {
  return { channel: r.channelPath, name: r.name, sampleRateHz: r.sampleRateHz, sampleCount: r.sampleCount, missingCount: r.missingCount, startedAt: r.startedAt };
}
