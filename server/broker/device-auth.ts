import { timingSafeEqual } from "node:crypto";
import net from "node:net";
import type { AedesOptions, AuthenticateError, Client } from "aedes";
import { findDeviceCredential } from "@/db/queries/devices";
import type { Db } from "@/db/client";
import { hashPassword, verifyPassword } from "@/lib/auth/password";
import { parseTopic } from "@/lib/protocol";
import type { Clock, Logger } from "../clock";
import { SignInThrottle, type SignInThrottleOptions } from "./sign-in-throttle";
import { errorMessage } from "@/lib/errors";

/** Who a broker connection is: a device limited to its own topics, or one of the sidecar's own clients. */
export type Principal = { kind: "device"; rig: string; device: string } | { kind: "internal"; name: string };

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
 * Internal clients (monitoring, tests, a second sidecar) read every topic but never speak for a
 * device: they may not publish its acknowledgements or its configuration (the sidecar publishes
 * configurations from inside the broker's process).
 */
function internalPublishAllowed(topic: string): boolean {
  const t = parseTopic(topic);
  return t === null || (t.kind !== "ack" && t.kind !== "config");
}

/** The hooks plus who each authenticated connection is (for binding acknowledgements to devices). */
export interface DeviceAuth {
  hooks: Required<Pick<AedesOptions, "authenticate" | "authorizePublish" | "authorizeSubscribe">>;
  principalOf(client: Client | null): Principal | undefined;
}

/** A hash nobody's password matches, verified for unknown usernames so they cost as much time as known ones. */
const decoyHash = hashPassword("tapwright decoy credential, never a real password");

/**
 * Aedes hooks that deny by default: every connection needs a username and password, either a
 * device credential from PostgreSQL (scrypt hash) or an internal credential; devices publish and
 * subscribe only on their own device's topics. Packets from the broker itself (client null) pass.
 * Every sign-in costs one scrypt verification whether or not the username exists, and wrong
 * passwords get growing delays per address and username (SignInThrottle).
 */
export function deviceAuthHooks(deps: {
  db: Db;
  internal: InternalCredential[];
  logger: Logger;
  clock: Clock;
  throttle?: SignInThrottleOptions;
}): DeviceAuth {
  const principals = new WeakMap<Client, Principal>();
  const throttle = new SignInThrottle(deps.clock, deps.throttle);

  async function identify(username: string, password: string): Promise<Principal | null> {
    const internal = deps.internal.find((c) => c.username === username);
    const row = internal ? undefined : await findDeviceCredential(deps.db, username);
    const matches = await verifyPassword(password, row?.passwordHash ?? (await decoyHash));
    if (internal) return sameSecret(internal.password, password) ? { kind: "internal", name: username } : null;
    if (!row || !matches) return null;
    return { kind: "device", rig: row.rigKey, device: row.deviceKey };
  }

  async function signIn(username: string, password: string, address: string): Promise<Principal | null> {
    const delay = throttle.delayMs(username, address);
    if (delay > 0) await new Promise<void>((resolve) => deps.clock.setTimeout(resolve, delay));
    const principal = await identify(username, password);
    if (principal) throttle.succeed(address);
    else throttle.fail(username, address);
    return principal;
  }

  const hooks: DeviceAuth["hooks"] = {
    authenticate(client, username, password, done) {
      if (!username || !password) return done(authError("credentials required", BAD_USERNAME_OR_PASSWORD), false);
      const address = client.conn instanceof net.Socket ? (client.conn.remoteAddress ?? "") : "";
      signIn(username, password.toString("utf8"), address).then(
        (principal) => {
          if (!principal) {
            deps.logger.warn(`broker sign-in refused for '${username.slice(0, 64)}' from ${address || "an unknown address"}`);
            return done(authError("bad username or password", BAD_USERNAME_OR_PASSWORD), false);
          }
          principals.set(client, principal);
          done(null, true);
        },
        (err: unknown) => {
          deps.logger.warn(`device authentication failed: ${errorMessage(err)}`);
          done(authError("authentication unavailable", SERVER_UNAVAILABLE), false);
        },
      );
    },
    authorizePublish(client, packet, done) {
      if (client === null) return done(null);
      const p = principals.get(client);
      if (p?.kind === "internal" && internalPublishAllowed(packet.topic)) return done(null);
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
  return { hooks, principalOf: (client) => (client ? principals.get(client) : undefined) };
}
