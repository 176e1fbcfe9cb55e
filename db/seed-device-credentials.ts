import { hashPassword } from "@/lib/auth/password";
import { DEMO_RIGS } from "@/lib/demo/lab";
import { demoDeviceCredential } from "@/lib/demo/device-credentials";
import type { Db } from "./client";
import { appendAudit } from "./queries/audit";
import { findDeviceId, insertDeviceCredentialIfAbsent } from "./queries/devices";

/**
 * Gives every demo device its own broker credential, like any real device: stored as an scrypt
 * hash, created only where the device has none (a rotated credential stays rotated). The password
 * is derived from the installation secret (lib/demo/device-credentials.ts) so the demo rig can sign in.
 */
export async function seedDemoDeviceCredentials(db: Db, secret: string): Promise<void> {
  for (const rig of DEMO_RIGS) {
    for (const device of rig.devices) {
      const deviceId = await findDeviceId(db, rig.key, device.key);
      if (deviceId === undefined) throw new Error(`demo device ${rig.key}/${device.key} is not seeded`);
      const { username, password } = demoDeviceCredential(secret, rig.key, device.key);
      await db.transaction().execute(async (trx) => {
        const created = await insertDeviceCredentialIfAbsent(trx, { deviceId, username, passwordHash: await hashPassword(password) });
        if (created) await appendAudit(trx, { actorId: null, action: "device.credential_created", entity: "device", entityId: deviceId, after: { username } });
      });
    }
  }
}
