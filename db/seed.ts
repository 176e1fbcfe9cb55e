import { hashPassword } from "@/lib/auth/password";
import { DEMO_ACCOUNTS, DEMO_ALARM_RULES, DEMO_RIGS } from "@/lib/demo/lab";
import type { Transaction } from "kysely";
import type { Db } from "./client";
import type { Database } from "./types";

/** Seeds the demo lab and one account per role; idempotent (existing rows are left as they are). */
export async function seedDemo(db: Db, demoPassword: string): Promise<void> {
  await db.transaction().execute(async (trx) => {
    for (const rig of DEMO_RIGS) {
      await trx.insertInto("rigs").values({ key: rig.key, name: rig.name, description: rig.description })
        .onConflict((oc) => oc.column("key").doNothing()).execute();
      const { id: rigId } = await trx.selectFrom("rigs").select("id").where("key", "=", rig.key).executeTakeFirstOrThrow();
      for (const device of rig.devices) {
        await trx.insertInto("devices")
          .values({ rig_id: rigId, key: device.key, name: device.name, coefficient_format: device.coefficientFormat })
          .onConflict((oc) => oc.columns(["rig_id", "key"]).doNothing()).execute();
        const { id: deviceId } = await trx.selectFrom("devices").select("id")
          .where("rig_id", "=", rigId).where("key", "=", device.key).executeTakeFirstOrThrow();
        for (const ch of device.channels) {
          await trx.insertInto("channels")
            .values({ device_id: deviceId, key: ch.key, name: ch.name, unit: ch.unit, sample_rate_hz: ch.sampleRateHz,
              range_min: ch.range[0], range_max: ch.range[1],
              max_sections: ch.capacity.maxSections, max_fir_taps: ch.capacity.maxFirTaps })
            .onConflict((oc) => oc.columns(["device_id", "key"]).doNothing()).execute();
        }
      }
    }
    for (const account of DEMO_ACCOUNTS) {
      const exists = await trx.selectFrom("users").select("id").where("email", "=", account.email).executeTakeFirst();
      if (exists) continue;
      await trx.insertInto("users").values({ email: account.email, display_name: account.displayName,
        password_hash: await hashPassword(demoPassword), role: account.role }).execute();
    }
    await seedAlarmRules(trx);
  });
}

/** The demo's alarm rules, each only on a channel that has never had a rule (a rule deleted in the demo stays deleted). */
async function seedAlarmRules(trx: Transaction<Database>): Promise<void> {
  const author = await trx.selectFrom("users").select("id").where("email", "=", "engineer@tapwright.test").executeTakeFirstOrThrow();
  for (const { channel: path, minDurationMs, ...rule } of DEMO_ALARM_RULES) {
    const [rig, device, key] = path.split("/");
    const channel = await trx.selectFrom("channels as c").innerJoin("devices as d", "d.id", "c.device_id").innerJoin("rigs as r", "r.id", "d.rig_id")
      .select("c.id").where("r.key", "=", rig).where("d.key", "=", device).where("c.key", "=", key).executeTakeFirstOrThrow();
    const had = await trx.selectFrom("alarm_rules").select("id").where("channel_id", "=", channel.id).executeTakeFirst();
    if (had) continue;
    await trx.insertInto("alarm_rules").values({ ...rule, channel_id: channel.id, min_duration_ms: minDurationMs, created_by: author.id }).execute();
  }
}
