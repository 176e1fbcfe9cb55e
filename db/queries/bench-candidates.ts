import { sql, type Transaction } from "kysely";
import { freeColorIndex } from "@/lib/bench/colors";
import type { FilterSpec } from "@/lib/dsp";
import { AppError } from "@/lib/errors";
import { MAX_CANDIDATES_PER_CLIENT } from "@/lib/protocol";
import type { Db } from "../client";
import { readSpec } from "../json-columns";
import type { Database } from "../types";

/** A candidate kept on an engineer's bench of one channel. */
export interface StoredCandidate {
  key: string;
  colorIndex: number;
  spec: FilterSpec;
}

/** An engineer's candidates on a channel, oldest first (the order they were added). */
export async function listBenchCandidates(db: Db, userId: number, channelId: number): Promise<StoredCandidate[]> {
  const rows = await db
    .selectFrom("bench_candidates")
    .select(["id", "key", "color_index as colorIndex", "spec"])
    .where("user_id", "=", userId)
    .where("channel_id", "=", channelId)
    .orderBy("id")
    .execute();
  return rows.map((r) => ({ key: r.key, colorIndex: r.colorIndex, spec: readSpec(r.spec, { table: "bench_candidates", id: r.id }) }));
}

/**
 * Stores a candidate (new, or a new spec and colour for the same key) and returns it as kept. The
 * engineer's row is locked first, so two tabs adding at once cannot pass the limit of
 * MAX_CANDIDATES_PER_CLIENT per channel. A new candidate whose colour another one already has (carried
 * over from a recording) gets the first free colour instead.
 */
export async function saveBenchCandidate(trx: Transaction<Database>, userId: number, channelId: number, c: StoredCandidate): Promise<StoredCandidate> {
  await trx.selectFrom("users").select("id").where("id", "=", userId).forUpdate().executeTakeFirst();
  const updated = await trx
    .updateTable("bench_candidates")
    .set({ spec: JSON.stringify(c.spec), color_index: c.colorIndex, updated_at: sql`now()` })
    .where("user_id", "=", userId)
    .where("channel_id", "=", channelId)
    .where("key", "=", c.key)
    .executeTakeFirst();
  if (updated.numUpdatedRows > 0n) return c;
  const used = (await listBenchCandidates(trx, userId, channelId)).map((k) => k.colorIndex);
  if (used.length >= MAX_CANDIDATES_PER_CLIENT) {
    throw new AppError("conflict", `A bench holds at most ${MAX_CANDIDATES_PER_CLIENT} candidates. Remove one first.`);
  }
  const colorIndex = used.includes(c.colorIndex) ? freeColorIndex(used)! : c.colorIndex;
  await trx
    .insertInto("bench_candidates")
    .values({ user_id: userId, channel_id: channelId, key: c.key, color_index: colorIndex, spec: JSON.stringify(c.spec) })
    .execute();
  return { ...c, colorIndex };
}

/** Removes a candidate; removing one that is not stored (never saved, or already gone) is not an error. */
export async function deleteBenchCandidate(db: Db, userId: number, channelId: number, key: string): Promise<void> {
  await db.deleteFrom("bench_candidates").where("user_id", "=", userId).where("channel_id", "=", channelId).where("key", "=", key).execute();
}
