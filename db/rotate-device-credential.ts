import { randomBytes } from "node:crypto";
import { hashPassword } from "@/lib/auth/password";
import { demoDeviceCredential } from "@/lib/demo/device-credentials";
import { DEMO_RIGS } from "@/lib/demo/lab";
import { isChannelPath } from "@/lib/protocol";
import { env } from "@/lib/env";
import { createDb } from "./client";
import { appendAudit } from "./queries/audit";
import { findDeviceId, replaceDeviceCredential } from "./queries/devices";

/**
 * `npm run device-credential -- <rig>/<device>`: gives a device a new random broker password, stores
 * only its scrypt hash, prints the password once, and audits the rotation. The device's old
 * credential stops working at its next sign-in.
 * `npm run device-credential -- --demo`: prints the demo devices' credentials as mosquitto_passwd
 * commands, for running the demo against an external broker.
 */
if (process.argv[2] === "--demo") {
  const secret = env().SESSION_SECRET;
  for (const rig of DEMO_RIGS) {
    for (const device of rig.devices) {
      const { username, password } = demoDeviceCredential(secret, rig.key, device.key);
      console.log(`mosquitto_passwd -b <password-file> '${username}' '${password}'`);
    }
  }
  process.exit(0);
}
const target = process.argv[2] ?? "";
const [rig, device] = target.split("/");
if (!isChannelPath(`${target}/x`)) {
  console.error("usage: npm run device-credential -- <rig>/<device>   (keys of a-z, 0-9 and -)");
  process.exit(2);
}
const db = createDb(env().DATABASE_URL, 1);
try {
  const deviceId = await findDeviceId(db, rig, device);
  if (deviceId === undefined) {
    console.error(`no device ${target}`);
    process.exitCode = 1;
  } else {
    const password = randomBytes(24).toString("base64url");
    const passwordHash = await hashPassword(password);
    await db.transaction().execute(async (trx) => {
      const replaced = await replaceDeviceCredential(trx, { deviceId, username: target, passwordHash });
      await appendAudit(trx, { actorId: null, action: "device.credential_rotated", entity: "device", entityId: deviceId, after: { username: target, replaced } });
    });
    console.log(`New MQTT credential for ${target} (shown once; store it on the device):\n  username: ${target}\n  password: ${password}`);
  }
} finally {
  await db.destroy();
}
