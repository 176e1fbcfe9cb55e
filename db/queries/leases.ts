import { sql } from "kysely";
import type { Db } from "../client";
import { channelPathSql } from "./channels";

/** Transaction-level advisory lock key that serialises lease rebalancing (any constant unique to it). */
const REBALANCE_LOCK = 0x7461_7001;

/** A channel a sidecar holds, with what it needs to start it. */
export interface LeasedChannel {
  channelId: number;
  path: string;
  sampleRateHz: number;
}

export interface LeaseRound {
  /** Channels this sidecar holds after the round (renewed or newly taken). */
  held: LeasedChannel[];
  /** Channels past this sidecar's fair share: stop them, then release them with releaseLeases. */
  surplus: LeasedChannel[];
  /** Live sidecars, this one included. */
  sidecars: number;
}

/** Records a sidecar's heartbeat (and its advertised WebSocket URL). */
export async function beatHeartbeat(db: Db, id: string, wsUrl: string): Promise<void> {
  await db
    .insertInto("sidecars")
    .values({ id, ws_url: wsUrl })
    .onConflict((oc) => oc.column("id").doUpdateSet({ ws_url: wsUrl, heartbeat_at: sql`now()` }))
    .execute();
}

/**
 * One lease round of sidecar `id`, in its own transaction under REBALANCE_LOCK (so two rounds never
 * count the same free channel): its heartbeat, renewal of what it holds to now() + ttl, and its fair
 * share ⌈channels / live sidecars⌉, where a sidecar is live while its heartbeat is younger than ttl.
 * Below its share it takes free channels (never leased, or expired), lowest id first; above it, the
 * highest ids are reported as surplus for the caller to stop and release. Channels are never taken
 * from a live holder: they change hands only through release or expiry.
 */
export async function leaseRound(db: Db, id: string, wsUrl: string, ttlMs: number): Promise<LeaseRound> {
  const ttl = sql`make_interval(secs => ${ttlMs / 1000})`;
  return db.transaction().execute(async (trx) => {
    await sql`select pg_advisory_xact_lock(${REBALANCE_LOCK})`.execute(trx);
    await beatHeartbeat(trx, id, wsUrl);
    await trx.updateTable("channel_leases").set({ expires_at: sql`now() + ${ttl}` }).where("sidecar_id", "=", id).execute();
    const counts = await sql<{ channels: number; sidecars: number; held: number }>`
      select (select count(*)::int from channels) as channels,
             (select count(*)::int from sidecars where heartbeat_at > now() - ${ttl}) as sidecars,
             (select count(*)::int from channel_leases where sidecar_id = ${id}) as held`.execute(trx);
    const { channels, sidecars, held } = counts.rows[0];
    const share = Math.ceil(channels / Math.max(1, sidecars));
    if (held < share) {
      await sql`
        insert into channel_leases (channel_id, sidecar_id, expires_at)
        select c.id, ${id}, now() + ${ttl} from channels c
        left join channel_leases l on l.channel_id = c.id
        where l.channel_id is null or l.expires_at < now()
        order by c.id limit ${share - held}
        on conflict (channel_id) do update set sidecar_id = excluded.sidecar_id, expires_at = excluded.expires_at, acquired_at = now()
        where channel_leases.expires_at < now()`.execute(trx);
    }
    const mine = await heldChannels(trx, id);
    return { held: mine.slice(0, share), surplus: mine.slice(share), sidecars };
  });
}

function heldChannels(db: Db, id: string): Promise<LeasedChannel[]> {
  return db
    .selectFrom("channel_leases as l")
    .innerJoin("channels as c", "c.id", "l.channel_id")
    .innerJoin("devices as d", "d.id", "c.device_id")
    .innerJoin("rigs as r", "r.id", "d.rig_id")
    .select(["c.id as channelId", channelPathSql("r", "d", "c").as("path"), "c.sample_rate_hz as sampleRateHz"])
    .where("l.sidecar_id", "=", id)
    .orderBy("c.id")
    .execute();
}

/** Gives up leases of `id` (after it stopped those channels), so another sidecar may take them at once. */
export async function releaseLeases(db: Db, id: string, channelIds: number[]): Promise<void> {
  if (!channelIds.length) return;
  await db.deleteFrom("channel_leases").where("sidecar_id", "=", id).where("channel_id", "in", channelIds).execute();
}

/** Removes a sidecar that stops (its leases go with it). */
export async function leaveSidecars(db: Db, id: string): Promise<void> {
  await db.deleteFrom("sidecars").where("id", "=", id).execute();
}

/** Where a channel is filtered now: the WebSocket URL of the holder of its unexpired lease, by path. */
export async function channelOwners(db: Db): Promise<Map<string, { sidecarId: string; wsUrl: string }>> {
  const rows = await db
    .selectFrom("channel_leases as l")
    .innerJoin("sidecars as s", "s.id", "l.sidecar_id")
    .innerJoin("channels as c", "c.id", "l.channel_id")
    .innerJoin("devices as d", "d.id", "c.device_id")
    .innerJoin("rigs as r", "r.id", "d.rig_id")
    .select([channelPathSql("r", "d", "c").as("path"), "s.id as sidecarId", "s.ws_url as wsUrl"])
    .where("l.expires_at", ">", sql<Date>`now()`)
    .execute();
  return new Map(rows.map((r) => [r.path, { sidecarId: r.sidecarId, wsUrl: r.wsUrl }]));
}

/** Revision id of the active deployment per channel id (a light query to notice promotions made elsewhere). */
export async function activeRevisionIds(db: Db, channelIds: number[]): Promise<Map<number, number>> {
  if (!channelIds.length) return new Map();
  const rows = await db
    .selectFrom("deployments")
    .select(["channel_id", "revision_id"])
    .where("state", "=", "active")
    .where("channel_id", "in", channelIds)
    // A return to no filter keeps the revision it removed, but runs nothing.
    .where(sql<boolean>`jsonb_array_length(coalesce(config -> 'stages', config -> 'sections')) > 0`)
    .execute();
  return new Map(rows.map((r) => [r.channel_id, r.revision_id]));
}

/** Sidecars whose heartbeat is younger than ttlMs (partitioned deployments; empty with one sidecar). */
export function liveSidecars(db: Db, ttlMs: number): Promise<Array<{ id: string; wsUrl: string }>> {
  return db
    .selectFrom("sidecars")
    .select(["id", "ws_url as wsUrl"])
    .where("heartbeat_at", ">", sql<Date>`now() - make_interval(secs => ${ttlMs / 1000})`)
    .orderBy("id")
    .execute();
}
