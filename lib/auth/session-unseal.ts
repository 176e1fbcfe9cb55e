import { unsealData } from "iron-session";
import { LRUCache } from "lru-cache";
import type { SessionData } from "./session-config";

interface Unsealed {
  secret: string;
  ttlSeconds: number;
  data: Readonly<SessionData>;
}

/**
 * Unsealing a session cookie derives keys and checks an HMAC on every call (about a fifth of a read
 * API's CPU under load). The result depends only on the sealed text, the secret and the seal's time
 * to live, so it is kept for a minute per cookie (at most 5,000 cookies). That keeps no session
 * alive: whether it is still valid (revoked, expired, password changed, account disabled) is asked of
 * the database on every request all the same (db/queries/sessions.ts liveSessionAccount).
 */
const unsealed = new LRUCache<string, Unsealed>({ max: 5000, ttl: 60_000 });

/** The session a sealed cookie holds, or {} when it is malformed, forged or expired (never a throw). */
export async function unsealSessionCookie(sealed: string, secret: string, ttlSeconds: number): Promise<SessionData> {
  const known = unsealed.get(sealed);
  if (known && known.secret === secret && known.ttlSeconds === ttlSeconds) return { ...known.data };
  let data: SessionData;
  try {
    const raw = await unsealData<SessionData>(sealed, { password: secret, ttl: ttlSeconds });
    data = { userId: raw.userId, sessionVersion: raw.sessionVersion, sessionId: raw.sessionId };
  } catch {
    return {};
  }
  if (data.userId !== undefined) unsealed.set(sealed, { secret, ttlSeconds, data: Object.freeze({ ...data }) });
  return data;
}
