import "server-only";
import { getIronSession, type IronSession } from "iron-session";
import { cookies } from "next/headers";
import { cookieSecure, env } from "@/lib/env";
import { DEVICE_COOKIE, DEVICE_COOKIE_PATH, DEVICE_TTL_SECONDS, deviceIdFor, newDeviceId, sealDevice } from "./device-cookie";
import { SESSION_COOKIE, SESSION_TTL_SECONDS, sessionOptions, type SessionData } from "./session-config";
import { unsealSessionCookie } from "./session-unseal";

/** The iron-session bound to this request's cookies (Next only). */
export async function getSession(): Promise<IronSession<SessionData>> {
  const e = env();
  return getIronSession<SessionData>(await cookies(), sessionOptions(e.SESSION_SECRET, cookieSecure(e)));
}

/** What this request's session cookie holds, for reading only (sign-in and sign-out write through getSession). */
export async function readSession(): Promise<SessionData> {
  const sealed = (await cookies()).get(SESSION_COOKIE)?.value;
  return sealed ? unsealSessionCookie(sealed, env().SESSION_SECRET, SESSION_TTL_SECONDS) : {};
}

/** The id this browser's device cookie proves for `email`, or null. */
export async function knownDevice(email: string): Promise<string | null> {
  return deviceIdFor((await cookies()).get(DEVICE_COOKIE)?.value, email, env().SESSION_SECRET);
}

/** Marks this browser as one that has signed in to `email` (keeping its id when it had one). */
export async function rememberDevice(email: string, id: string | null): Promise<void> {
  const e = env();
  const value = await sealDevice(id ?? newDeviceId(), email, e.SESSION_SECRET);
  (await cookies()).set(DEVICE_COOKIE, value, {
    httpOnly: true,
    sameSite: "strict",
    secure: cookieSecure(e),
    path: DEVICE_COOKIE_PATH,
    maxAge: DEVICE_TTL_SECONDS,
  });
}
