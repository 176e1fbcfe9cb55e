import { createHmac } from "node:crypto";

/**
 * The MQTT credential of a demo device: username `<rig>/<device>` (the form the broker ACL examples
 * use, so `%u` in a mosquitto pattern is the device's topic prefix) and a password derived from the
 * installation's secret with HMAC-SHA256 (RFC 2104), so the seed can store its hash and the demo rig,
 * which simulates the device, can present it without any file holding it in clear.
 */
export function demoDeviceCredential(secret: string, rig: string, device: string): { username: string; password: string } {
  const username = `${rig}/${device}`;
  const password = createHmac("sha256", secret).update(`tapwright demo device ${username}`).digest("base64url");
  return { username, password };
}
