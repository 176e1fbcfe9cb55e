import type { Db } from "../client";


/** A device credential with the device's place in the lab, for the broker's authentication. */
export interface DeviceCredentialRow {
  username: string;
  passwordHash: string;
  deviceId: number;
  rigKey: string;
  deviceKey: string;
}

export function findDeviceCredential(db: Db, username: string): Promise<DeviceCredentialRow | undefined> {
  return db
    .selectFrom("device_credentials as k")
    .innerJoin("devices as d", "d.id", "k.device_id")
    .innerJoin("rigs as r", "r.id", "d.rig_id")
    .select(["k.username", "k.password_hash as passwordHash", "d.id as deviceId", "r.key as rigKey", "d.key as deviceKey"])
    .where("k.username", "=", username)
    .executeTakeFirst();
}

export async function findDeviceId(db: Db, rigKey: string, deviceKey: string): Promise<number | undefined> {
  const row = await db
    .selectFrom("devices as d")
    .innerJoin("rigs as r", "r.id", "d.rig_id")
    .select("d.id")
    .where("r.key", "=", rigKey)
    .where("d.key", "=", deviceKey)
    .executeTakeFirst();
  return row?.id;
}

/** Creates a credential or replaces the password of an existing username (same device only). */
export async function upsertDeviceCredential(
  db: Db,
  credential: { deviceId: number; username: string; passwordHash: string },
): Promise<void> {
  await db
    .insertInto("device_credentials")
    .values({ device_id: credential.deviceId, username: credential.username, password_hash: credential.passwordHash })
    .onConflict((oc) =>
      oc
        .column("username")
        .doUpdateSet({ password_hash: credential.passwordHash })
        .where("device_credentials.device_id", "=", credential.deviceId),
    )
    .execute();
}

/** Inserts a device's credential only when the device has none yet (so a rotated one is never reverted). */
export async function insertDeviceCredentialIfAbsent(
  db: Db,
  credential: { deviceId: number; username: string; passwordHash: string },
): Promise<boolean> {
  const existing = await db.selectFrom("device_credentials").select("username").where("device_id", "=", credential.deviceId).executeTakeFirst();
  if (existing) return false;
  await db
    .insertInto("device_credentials")
    .values({ device_id: credential.deviceId, username: credential.username, password_hash: credential.passwordHash })
    .execute();
  return true;
}

/** Replaces every credential of a device by one new credential (rotation); returns how many were replaced. */
export async function replaceDeviceCredential(
  db: Db,
  credential: { deviceId: number; username: string; passwordHash: string },
): Promise<number> {
  const removed = await db.deleteFrom("device_credentials").where("device_id", "=", credential.deviceId).executeTakeFirst();
  await db
    .insertInto("device_credentials")
    .values({ device_id: credential.deviceId, username: credential.username, password_hash: credential.passwordHash })
    .execute();
  return Number(removed.numDeletedRows);
}

/** Every device with its rig's key, ordered by rig and device key. */
export function listDevices(db: Db): Promise<Array<{ id: number; rigKey: string; key: string }>> {
  return db
    .selectFrom("devices as d")
    .innerJoin("rigs as r", "r.id", "d.rig_id")
    .select(["d.id", "r.key as rigKey", "d.key"])
    .orderBy("r.key")
    .orderBy("d.key")
    .execute();
}

/** Ids of devices with a deployment still waiting for its acknowledgement. */
export async function listDevicesWithPendingDeployments(db: Db): Promise<Set<number>> {
  const rows = await db
    .selectFrom("deployments as p")
    .innerJoin("channels as c", "c.id", "p.channel_id")
    .select("c.device_id")
    .distinct()
    .where("p.state", "=", "pending")
    .execute();
  return new Set(rows.map((r) => r.device_id));
}
