import { execFileSync, spawn, type ChildProcess } from "node:child_process";
import { chmodSync, copyFileSync, mkdtempSync, writeFileSync } from "node:fs";
import net from "node:net";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { sealData } from "iron-session";
import mqtt, { type MqttClient } from "mqtt";
import WebSocket from "ws";
import type { Db } from "@/db/client";
import { createSession } from "@/db/queries/sessions";
import { findUserByEmail } from "@/db/queries/users";
import { liveDesign } from "@/lib/dsp";
import { seedDemo } from "@/db/seed";
import { seedDemoDeviceCredentials } from "@/db/seed-device-credentials";
import { SESSION_COOKIE } from "@/lib/auth/session-config";
import { configTopic, decodeFrames, deviceConfigSchema, type DeviceConfig, type ServerMessage } from "@/lib/protocol";
import { systemClock, type Logger } from "@/server/clock";
import { startSidecar, type Sidecar, type SidecarOptions } from "@/server/sidecar";
import { freshDb } from "./support/fresh-db";

export const SECRET = "sidecar-test-secret-0123456789abcdef-0123456789";
export const TTL = 3600;

/** Collects log lines instead of printing them. */
export function memoryLogger(): Logger & { lines: string[] } {
  const lines: string[] = [];
  return { lines, info: (m) => lines.push(m), warn: (m) => lines.push(m) };
}

/** A migrated, seeded database of its own. */
export async function seededDb(label: string): Promise<{ db: Db; url: string; close: () => Promise<void> }> {
  const fresh = await freshDb(label);
  await seedDemo(fresh.db, "sidecar-test-password");
  await seedDemoDeviceCredentials(fresh.db, SECRET);
  return fresh;
}

/** The Cookie header a signed-in demo account would send (a stored session is started for it; `sessionId` overrides its id). */
export async function cookieFor(db: Db, email: string, change: { sessionVersion?: number; sessionId?: string } = {}): Promise<string> {
  const user = await findUserByEmail(db, email);
  if (!user) throw new Error(`no user ${email}`);
  const sessionId = change.sessionId ?? (await createSession(db, user.id, TTL));
  const sealed = await sealData({ userId: user.id, sessionVersion: change.sessionVersion ?? user.session_version, sessionId }, { password: SECRET, ttl: TTL });
  return `${SESSION_COOKIE}=${sealed}`;
}

/** Designs in-process: the tests of the stream do not need the design threads (tests/integration/sidecar-limits.test.ts does). */
export const inlineDesign = async (spec: Parameters<typeof liveDesign>[0]) => liveDesign(spec);

/** A sidecar on loopback with port 0 everywhere, the embedded broker, and timers off (tests call hub.tick()). */
export function testSidecar(db: Db, over: Partial<SidecarOptions> = {}): Promise<Sidecar> {
  return startSidecar({
    db,
    clock: systemClock,
    logger: memoryLogger(),
    sessionSecret: SECRET,
    sessionTtlSeconds: TTL,
    http: { host: "127.0.0.1", port: 0 },
    mqtt: { mode: "embedded", host: "127.0.0.1", port: 0, requireDeviceAuth: false },
    republishFiltered: false,
    timers: false,
    design: inlineDesign,
    ...over,
  });
}

/** Polls until cond() is true (real sockets need a moment); throws after timeoutMs. */
export async function until(cond: () => boolean, timeoutMs = 5000, what = "condition"): Promise<void> {
  const end = Date.now() + timeoutMs;
  while (!cond()) {
    if (Date.now() > end) throw new Error(`timed out waiting for ${what}`);
    await new Promise((r) => setTimeout(r, 5));
  }
}

export interface TestSocket {
  ws: WebSocket;
  messages: ServerMessage[];
  send(message: unknown): void;
  /** Waits (up to timeoutMs, default 5 s) for the next message (after those already seen) matching the predicate. */
  next<T extends ServerMessage["type"]>(
    type: T,
    where?: (m: Extract<ServerMessage, { type: T }>) => boolean,
    timeoutMs?: number,
  ): Promise<Extract<ServerMessage, { type: T }>>;
}

/** Opens a WebSocket to the sidecar; resolves once open, or rejects with the refusal status. */
export function openSocket(port: number, cookie?: string): Promise<TestSocket> {
  return new Promise((resolve, reject) => {
    const ws = new WebSocket(`ws://127.0.0.1:${port}/ws`, { headers: cookie ? { cookie } : {} });
    const messages: ServerMessage[] = [];
    let seen = 0;
    ws.on("message", (data, isBinary) => {
      if (!isBinary) return messages.push(JSON.parse(data.toString()) as ServerMessage);
      const decoded = decodeFrames(new Uint8Array(data as Buffer));
      if (!decoded.ok) throw new Error(`bad frame: ${decoded.reason}`);
      messages.push(...decoded.frames);
    });
    ws.on("unexpected-response", (_req, res) => reject(new Error(`HTTP ${res.statusCode}`)));
    ws.on("error", reject);
    ws.on("open", () =>
      resolve({
        ws,
        messages,
        send: (m) => ws.send(JSON.stringify(m)),
        async next(type, where, timeoutMs = 5000) {
          let found: ServerMessage | undefined;
          await until(() => {
            for (; seen < messages.length; seen++) {
              const m = messages[seen];
              if (m.type === type && (!where || where(m as never))) {
                found = m;
                seen++;
                return true;
              }
            }
            return false;
          }, timeoutMs, `a ${type} message`);
          return found as never;
        },
      }),
    );
  });
}

export function connectDevice(url: string, opts: mqtt.IClientOptions = {}): Promise<MqttClient> {
  return mqtt.connectAsync(url, { reconnectPeriod: 0, ...opts });
}

/** A free loopback TCP port (bound and released). */
export function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const server = net.createServer();
    server.once("error", reject);
    server.listen(0, "127.0.0.1", () => {
      const port = (server.address() as net.AddressInfo).port;
      server.close(() => resolve(port));
    });
  });
}

/**
 * Debian's mosquitto on a loopback port with a throwaway config; stop() kills it, start() brings it
 * back on the same port. `auth` switches anonymous access off and loads a password file (made with
 * mosquitto_passwd) and an ACL file. `port` pins the listener (default: a free one).
 */
export async function mosquitto(
  auth?: { users: Array<{ username: string; password: string }>; aclFile: string },
  fixedPort?: number,
): Promise<{ port: number; url: string; start: () => Promise<void>; stop: () => Promise<void>; pid: () => number | undefined }> {
  const port = fixedPort ?? (await freePort());
  const dir = mkdtempSync(join(tmpdir(), "tw-mosquitto-"));
  const conf = join(dir, "mosquitto.conf");
  let access = "allow_anonymous true\n";
  if (auth) {
    // Run as root, mosquitto drops to its own user before reading these: make them readable to it.
    chmodSync(dir, 0o755);
    const passwords = join(dir, "passwords");
    writeFileSync(passwords, "", { mode: 0o644 });
    for (const u of auth.users) execFileSync("/usr/bin/mosquitto_passwd", ["-b", passwords, u.username, u.password]);
    chmodSync(passwords, 0o644);
    const acl = join(dir, "acl");
    copyFileSync(auth.aclFile, acl);
    chmodSync(acl, 0o644);
    access = `allow_anonymous false\npassword_file ${passwords}\nacl_file ${acl}\n`;
  }
  writeFileSync(conf, `listener ${port} 127.0.0.1\n${access}persistence false\n`);
  let child: ChildProcess | undefined;
  const start = async () => {
    child = spawn("/usr/sbin/mosquitto", ["-c", conf], { stdio: "ignore" });
    const end = Date.now() + 5000;
    for (;;) {
      const open = await new Promise<boolean>((resolve) => {
        const s = net.connect(port, "127.0.0.1", () => s.end(() => resolve(true)));
        s.on("error", () => resolve(false));
      });
      if (open) return;
      if (Date.now() > end) throw new Error("mosquitto did not start");
      await new Promise((r) => setTimeout(r, 20));
    }
  };
  const stop = async () => {
    const c = child;
    child = undefined;
    if (!c || c.exitCode !== null) return;
    await new Promise<void>((resolve) => {
      c.once("exit", () => resolve());
      c.kill("SIGKILL");
    });
  };
  await start();
  return { port, url: `mqtt://127.0.0.1:${port}`, start, stop, pid: () => child?.pid };
}

/** What a fresh MQTT subscriber to a device's config topic receives: the retained document, or null (after 500 ms). */
export async function retainedDocument(url: string, rig: string, device: string): Promise<DeviceConfig | null> {
  const client = await mqtt.connectAsync(url, { clean: true, reconnectPeriod: 0 });
  try {
    const received = new Promise<DeviceConfig | null>((resolve) => {
      const timer = setTimeout(() => resolve(null), 500);
      client.on("message", (_topic, payload, packet) => {
        if (!packet.retain) return;
        clearTimeout(timer);
        resolve(payload.length ? deviceConfigSchema.parse(JSON.parse(payload.toString("utf8"))) : null);
      });
    });
    await client.subscribeAsync(configTopic(rig, device), { qos: 1 });
    return await received;
  } finally {
    await client.endAsync();
  }
}
