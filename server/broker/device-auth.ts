import { timingSafeEqual } from "node:crypto";
import type { AedesOptions, AuthenticateError, Client } from "aedes";
import { findDeviceCredential } from "@/db/queries/devices";
import type { Db } from "@/db/client";
import { verifyPassword } from "@/lib/auth/password";
import { parseTopic } from "@/lib/protocol";
import type { Logger } from "../clock";

/** Who a broker connection is: a device limited to its own topics, or one of the sidecar's own clients. */
type Principal = { kind: "device"; rig: string; device: string } | { kind: "internal"; name: string };

/** A credential the sidecar hands to its own clients (demo rig, a second sidecar); compared in constant time. */
export interface InternalCredential {
  username: string;
  password: string;
}

// Connect return codes, MQTT 3.1.1 §3.2.2.3.
const SERVER_UNAVAILABLE = 3;
const BAD_USERNAME_OR_PASSWORD = 4;

function authError(message: string, returnCode: number): AuthenticateError {
  return Object.assign(new Error(message), { returnCode }) as AuthenticateError;
}

function sameSecret(a: string, b: string): boolean {
  const x = Buffer.from(a);
  const y = Buffer.from(b);
  return x.length === y.length && timingSafeEqual(x, y);
}

/** Topics a device may publish to: its channels' samples, its status (and last will) and its acks. */
function devicePublishAllowed(p: { rig: string; device: string }, topic: string): boolean {
  const t = parseTopic(topic);
  if (!t || t.rig !== p.rig || t.device !== p.device) return false;
  return t.kind === "samples" || t.kind === "status" || t.kind === "ack";
}

/** A device may subscribe to its own config topic only (no wildcards). */
function deviceSubscribeAllowed(p: { rig: string; device: string }, filter: string): boolean {
  const t = parseTopic(filter);
  return t !== null && t.kind === "config" && t.rig === p.rig && t.device === p.device;
}

/**
 * Aedes hooks that deny by default: every connection needs a username and password, either a
 * device credential from PostgreSQL (scrypt hash) or an internal credential; devices publish and
 * subscribe only on their own device's topics. Packets from the broker itself (client null) pass.
 */
export function deviceAuthHooks(deps: {
  db: Db;
  internal: InternalCredential[];
  logger: Logger;
}): Required<Pick<AedesOptions, "authenticate" | "authorizePublish" | "authorizeSubscribe">> {
  const principals = new WeakMap<Client, Principal>();

  async function identify(username: string, password: string): Promise<Principal | null> {
    const internal = deps.internal.find((c) => c.username === username);
    if (internal) return sameSecret(internal.password, password) ? { kind: "internal", name: username } : null;
    const row = await findDeviceCredential(deps.db, username);
    if (!row || !(await verifyPassword(password, row.passwordHash))) return null;
    return { kind: "device", rig: row.rigKey, device: row.deviceKey };
  }

  return {
    authenticate(client, username, password, done) {
      if (!username || !password) return done(authError("credentials required", BAD_USERNAME_OR_PASSWORD), false);
      identify(username, password.toString("utf8")).then(
        (principal) => {
          if (!principal) return done(authError("bad username or password", BAD_USERNAME_OR_PASSWORD), false);
          principals.set(client, principal);
          done(null, true);
        },
        (err: unknown) => {
          deps.logger.warn(`device authentication failed: ${err instanceof Error ? err.message : String(err)}`);
          done(authError("authentication unavailable", SERVER_UNAVAILABLE), false);
        },
      );
    },
    authorizePublish(client, packet, done) {
      if (client === null) return done(null);
      const p = principals.get(client);
      if (p?.kind === "internal") return done(null);
      if (p?.kind === "device" && devicePublishAllowed(p, packet.topic)) return done(null);
      done(new Error(`publish to ${packet.topic} not allowed`));
    },
    authorizeSubscribe(client, subscription, done) {
      const p = principals.get(client);
      if (p?.kind === "internal") return done(null, subscription);
      if (p?.kind === "device" && deviceSubscribeAllowed(p, subscription.topic)) return done(null, subscription);
      done(new Error(`subscribe to ${subscription.topic} not allowed`));
    },
  };
}
