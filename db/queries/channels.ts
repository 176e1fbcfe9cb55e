import { sql } from "kysely";
import type { Db } from "../client";


/** A channel with its place in the lab; `path` is `<rig>/<device>/<channel>` built from keys. */
export interface ChannelRow {
  id: number;
  path: string;
  rigKey: string;
  rigName: string;
  deviceKey: string;
  deviceName: string;
  key: string;
  name: string;
  unit: string;
  sampleRateHz: number;
  rangeMin: number;
  rangeMax: number;
  coefficientFormat: "f32" | "q15" | "q31";
  /** Capacity of the channel's device: sections and FIR taps over a whole chain. */
  maxSections: number;
  maxFirTaps: number;
}

/** SQL for a channel's path `<rig>/<device>/<channel>` from the keys of the given table aliases. */
export function channelPathSql(rig: string, device: string, channel: string) {
  return sql<string>`${sql.ref(`${rig}.key`)} || '/' || ${sql.ref(`${device}.key`)} || '/' || ${sql.ref(`${channel}.key`)}`;
}

function channelQuery(db: Db) {
  return db
    .selectFrom("channels as c")
    .innerJoin("devices as d", "d.id", "c.device_id")
    .innerJoin("rigs as r", "r.id", "d.rig_id")
    .select([
      "c.id",
      channelPathSql("r", "d", "c").as("path"),
      "r.key as rigKey",
      "r.name as rigName",
      "d.key as deviceKey",
      "d.name as deviceName",
      "c.key",
      "c.name",
      "c.unit",
      "c.sample_rate_hz as sampleRateHz",
      "c.range_min as rangeMin",
      "c.range_max as rangeMax",
      "d.coefficient_format as coefficientFormat",
      "c.max_sections as maxSections",
      "c.max_fir_taps as maxFirTaps",
    ]);
}

export function listChannels(db: Db): Promise<ChannelRow[]> {
  return channelQuery(db).orderBy("r.key").orderBy("d.key").orderBy("c.key").execute();
}

export function findChannelByPath(db: Db, path: string): Promise<ChannelRow | undefined> {
  const [rig, device, channel, ...rest] = path.split("/");
  // Only well-formed keys can exist (the tables' checks); anything else is not looked up at all.
  const key = /^[a-z0-9][a-z0-9-]{0,62}$/;
  if (![rig, device, channel].every((k) => k !== undefined && key.test(k)) || rest.length) return Promise.resolve(undefined);
  return channelQuery(db)
    .where("r.key", "=", rig)
    .where("d.key", "=", device)
    .where("c.key", "=", channel)
    .executeTakeFirst();
}
