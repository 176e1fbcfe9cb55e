import "server-only";
import { getIronSession, type IronSession } from "iron-session";
import { cookies } from "next/headers";
import { env } from "@/lib/env";
import { sessionOptions, type SessionData } from "./session-config";

/** The iron-session bound to this request's cookies (Next only). */
export async function getSession(): Promise<IronSession<SessionData>> {
  const e = env();
  return getIronSession<SessionData>(await cookies(), sessionOptions(e.SESSION_SECRET, e.COOKIE_SECURE === "1"));
}
