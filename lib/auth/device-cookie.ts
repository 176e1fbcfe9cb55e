import { randomBytes } from "node:crypto";
import { sealData, unsealData } from "iron-session";

/**
 * The device cookie: proof that this browser has signed in to an account before. Sign-in
 * throttling then counts its failures on their own (lib/auth/throttle.ts), so strangers failing from
 * the same address, or against the same account, cannot lock its owner out. It is sealed with the
 * session secret, names the account, is sent only to the sign-in route and lasts a year.
 */
export const DEVICE_COOKIE = "tapwright_device";
export const DEVICE_TTL_SECONDS = 60 * 60 * 24 * 365;
export const DEVICE_COOKIE_PATH = "/api/auth/login";

interface DeviceData {
  id: string;
  email: string;
}

/** A new device id (128 random bits, base64url). */
export function newDeviceId(): string {
  return randomBytes(16).toString("base64url");
}

export function sealDevice(id: string, email: string, secret: string): Promise<string> {
  const data: DeviceData = { id, email: email.toLowerCase() };
  return sealData(data, { password: secret, ttl: DEVICE_TTL_SECONDS });
}

/** The device id a cookie proves for this account, or null (no cookie, forged, expired, or another account's). */
export async function deviceIdFor(sealed: string | undefined, email: string, secret: string): Promise<string | null> {
  if (!sealed) return null;
  try {
    const data = await unsealData<Partial<DeviceData>>(sealed, { password: secret, ttl: DEVICE_TTL_SECONDS });
    return typeof data.id === "string" && data.email === email.toLowerCase() ? data.id : null;
  } catch {
    return null;
  }
}
