import type { MqttClient } from "mqtt";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Db } from "@/db/client";
import { findUserByEmail, updateUser } from "@/db/queries/users";
import { hashPassword } from "@/lib/auth/password";
import { encodeBinarySamples, samplesTopic, type FrameMessage } from "@/lib/protocol";
import { systemClock, type Clock, type Timer } from "@/server/clock";
import type { Sidecar } from "@/server/sidecar";
import { createFaultLog } from "@/server/ingest/fault-log";
import { createPipeline } from "@/server/pipeline/pipeline";
import { SESSION_ENDED } from "@/lib/protocol";
import { createHub } from "@/server/ws/hub";
import { createSession, liveSessionAccounts } from "@/db/queries/sessions";
import { connectDevice, cookieFor, inlineDesign, memoryLogger, openSocket, seededDb, testSidecar, until, type TestSocket } from "./sidecar-support";

const STRAIN = "hydraulic-press/env-node/frame-strain"; // 1 kHz
const spec = { kind: "iir", family: "butterworth", response: "lowpass", order: 2, cutoffHz: 40, sampleRateHz: 1000 };

/**
 * Real time, but intervals are held for the test to fire: the hub's status timer (2 s) runs only
 * when the test says so, so "within one tick" is one call, not a sleep.
 */
const intervals = new Map<Timer, { fn: () => void; ms: number }>();
const clock: Clock = {
  ...systemClock,
  setInterval(fn, ms) {
    const handle = setTimeout(() => undefined, 0);
    intervals.set(handle, { fn, ms });
    return handle;
  },
  clearInterval: (t) => void intervals.delete(t),
};
function fireStatusTick(): void {
  for (const { fn, ms } of intervals.values()) if (ms === 2000) fn();
}

let store: { db: Db; close: () => Promise<void> };
let sidecar: Sidecar;
let device: MqttClient;
let seq = 0;

beforeAll(async () => {
  store = await seededDb("sidecar_session");
  sidecar = await testSidecar(store.db, { clock, timers: true });
  device = await connectDevice(sidecar.mqttUrl);
});

afterAll(async () => {
  await device?.endAsync();
  await sidecar?.close();
  await store?.close();
});

function closed(socket: TestSocket): Promise<{ code: number; reason: string }> {
  return new Promise((resolve) => socket.ws.once("close", (code, reason) => resolve({ code, reason: reason.toString() })));
}

async function userId(email: string): Promise<number> {
  return (await findUserByEmail(store.db, email))!.id;
}

/** Publishes 100 samples and sends them out, so frames show which traces each client has. */
async function publishAndTick(): Promise<void> {
  const before = sidecar.ingest.accepted.messages;
  const values = Float64Array.from({ length: 100 }, (_, i) => Math.sin(i / 5));
  await device.publishAsync(samplesTopic(STRAIN), Buffer.from(encodeBinarySamples({ seq: seq++, t0: seq * 100, sampleRateHz: 1000, values })));
  await until(() => sidecar.ingest.accepted.messages === before + 1, 5000, "ingest");
  sidecar.hub.tick();
}

describe("the hub rechecks open sessions on its status tick", () => {
  it("closes a disabled account's socket with 4401 within one tick and leaves the others open", async () => {
    const operator = await openSocket(sidecar.httpPort, await cookieFor(store.db, "operator@tapwright.test"));
    const admin = await openSocket(sidecar.httpPort, await cookieFor(store.db, "admin@tapwright.test"));
    await operator.next("hello");
    await admin.next("hello");
    const closing = closed(operator);

    fireStatusTick();
    await sidecar.hub.recheckSessions();
    expect(operator.ws.readyState).toBe(operator.ws.OPEN);

    await updateUser(store.db, await userId("operator@tapwright.test"), { disabled: true });
    fireStatusTick();
    const { code, reason } = await closing;
    expect(code).toBe(SESSION_ENDED);
    expect(reason).toMatch(/session has ended/);
    expect(admin.ws.readyState).toBe(admin.ws.OPEN);
    await until(() => sidecar.hub.clientCount === 1, 2000, "the closed client to leave the hub");
    admin.ws.close();
  });

  it("closes a socket whose session version was bumped (a password change)", async () => {
    const lead = await openSocket(sidecar.httpPort, await cookieFor(store.db, "lead@tapwright.test"));
    await lead.next("hello");
    const closing = closed(lead);
    await updateUser(store.db, await userId("lead@tapwright.test"), { passwordHash: await hashPassword("a-new-password-123") });
    fireStatusTick();
    expect((await closing).code).toBe(SESSION_ENDED);
  });

  it("applies a demotion to later messages: the engineer's candidates are dropped and candidate.add is refused", async () => {
    const engineer = await openSocket(sidecar.httpPort, await cookieFor(store.db, "engineer@tapwright.test"));
    expect((await engineer.next("hello")).role).toBe("engineer");
    engineer.send({ type: "subscribe", channel: STRAIN });
    engineer.send({ type: "candidate.add", channel: STRAIN, id: "lp", spec });
    engineer.send({ type: "subscribe", channel: "no-such/rig/channel" });
    await engineer.next("error", (m) => m.code === "unknown_channel");
    await publishAndTick();
    const withCandidate = await engineer.next("frame");
    expect(Object.keys((withCandidate as FrameMessage).traces)).toContain("lp");

    await updateUser(store.db, await userId("engineer@tapwright.test"), { role: "operator" });
    fireStatusTick();
    const notice = await engineer.next("error");
    expect(notice).toMatchObject({ code: "forbidden", message: expect.stringMatching(/operator.*candidates were removed/) });
    expect(engineer.ws.readyState).toBe(engineer.ws.OPEN);

    await publishAndTick();
    const after = await engineer.next("frame");
    expect(Object.keys(after.traces)).not.toContain("lp");
    engineer.send({ type: "candidate.add", channel: STRAIN, id: "lp2", spec });
    expect((await engineer.next("error")).code).toBe("forbidden");

    await updateUser(store.db, await userId("engineer@tapwright.test"), { role: "engineer" });
    await sidecar.hub.recheckSessions();
    engineer.send({ type: "candidate.add", channel: STRAIN, id: "lp3", spec });
    await publishAndTick();
    expect(Object.keys((await engineer.next("frame")).traces)).toContain("lp3");
    engineer.ws.close();
  });

  it("batches the lookup: one query per tick for every socket, and a tick during a lookup shares it", async () => {
    const calls: string[][] = [];
    const hub = createHub({
      pipeline: createPipeline({ channels: [] }),
      faults: createFaultLog({ clock, logger: memoryLogger() }),
      clock,
      logger: memoryLogger(),
      busState: () => "connected",
      sessions: async (ids) => {
        calls.push(ids);
        return liveSessionAccounts(store.db, ids);
      },
      design: inlineDesign,
    });
    const closes: string[] = [];
    const sessionIds: string[] = [];
    for (const [id, email] of [["a", "admin@tapwright.test"], ["b", "admin@tapwright.test"], ["c", "lead@tapwright.test"]] as const) {
      const account = (await findUserByEmail(store.db, email))!;
      const sessionId = id === "b" ? sessionIds[0] : await createSession(store.db, account.id, 3600);
      sessionIds.push(sessionId);
      hub.add({
        id,
        user: { id: account.id, email, name: account.display_name, role: account.role },
        session: { userId: account.id, sessionVersion: account.session_version, sessionId },
        send: () => undefined,
        bufferedAmount: () => 0,
        close: () => closes.push(id),
      });
    }
    await Promise.all([hub.recheckSessions(), hub.recheckSessions()]);
    expect(calls).toEqual([[sessionIds[0], sessionIds[2]]]);
    expect(closes).toEqual([]);
  });
});
