import { sealData } from "iron-session";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Db } from "@/db/client";
import { findDeviceId, upsertDeviceCredential } from "@/db/queries/devices";
import { revokeSession } from "@/db/queries/sessions";
import { findUserByEmail, updateUser } from "@/db/queries/users";
import { hashPassword } from "@/lib/auth/password";
import { SESSION_COOKIE } from "@/lib/auth/session-config";
import { encodeBinarySamples, samplesTopic } from "@/lib/protocol";
import type { Sidecar } from "@/server/sidecar";
import { connectDevice, cookieFor, openSocket, SECRET, seededDb, testSidecar, TTL, until } from "./sidecar-support";

const STRAIN = "hydraulic-press/env-node/frame-strain";
const spec = { kind: "iir", family: "butterworth", response: "lowpass", order: 2, cutoffHz: 40, sampleRateHz: 1000 };

let store: { db: Db; close: () => Promise<void> };
let sidecar: Sidecar;

beforeAll(async () => {
  store = await seededDb("sidecar_auth");
  sidecar = await testSidecar(store.db, {
    mqtt: { mode: "embedded", host: "127.0.0.1", port: 0, requireDeviceAuth: true, internal: [{ username: "bench", password: "internal-secret" }] },
  });
  const deviceId = await findDeviceId(store.db, "hydraulic-press", "env-node");
  await upsertDeviceCredential(store.db, { deviceId: deviceId!, username: "env-node-1", passwordHash: await hashPassword("device-secret") });
});

afterAll(async () => {
  await sidecar?.close();
  await store?.close();
});

describe("WebSocket upgrade goes through the session guard", () => {
  it("refuses a missing cookie with 401", async () => {
    await expect(openSocket(sidecar.httpPort)).rejects.toThrow("HTTP 401");
  });

  it("refuses a forged cookie with 401", async () => {
    const user = await findUserByEmail(store.db, "admin@tapwright.test");
    const forged = await sealData({ userId: user!.id, sessionVersion: user!.session_version }, { password: "x".repeat(40), ttl: TTL });
    await expect(openSocket(sidecar.httpPort, `${SESSION_COOKIE}=${forged}`)).rejects.toThrow("HTTP 401");
    await expect(openSocket(sidecar.httpPort, `${SESSION_COOKIE}=Fe26.2*garbage`)).rejects.toThrow("HTTP 401");
  });

  it("refuses a malformed cookie with 401, not 503", async () => {
    for (const bad of ["%E0%A4%A", "%", "Fe26.2**", "x".repeat(5000)]) {
      await expect(openSocket(sidecar.httpPort, `${SESSION_COOKIE}=${bad}`)).rejects.toThrow("HTTP 401");
    }
  });

  it("refuses a signed-out session with 401 however many copies of its cookie exist", async () => {
    const cookie = await cookieFor(store.db, "operator@tapwright.test");
    const first = await openSocket(sidecar.httpPort, cookie);
    first.ws.close();
    const sealed = decodeURIComponent(cookie.slice(SESSION_COOKIE.length + 1));
    const { unsealData } = await import("iron-session");
    const { sessionId } = await unsealData<{ sessionId: string }>(sealed, { password: SECRET, ttl: TTL });
    await revokeSession(store.db, sessionId);
    await expect(openSocket(sidecar.httpPort, cookie)).rejects.toThrow("HTTP 401");
  });

  it("refuses a stale session version and a disabled account with 401", async () => {
    const stale = await cookieFor(store.db, "lead@tapwright.test", { sessionVersion: 0 });
    await expect(openSocket(sidecar.httpPort, stale)).rejects.toThrow("HTTP 401");
    const cookie = await cookieFor(store.db, "lead@tapwright.test");
    const user = await findUserByEmail(store.db, "lead@tapwright.test");
    await updateUser(store.db, user!.id, { disabled: true });
    await expect(openSocket(sidecar.httpPort, cookie)).rejects.toThrow("HTTP 401");
  });

  it("refuses an operator's candidate.add and a malformed message; holds an engineer to the candidate limits", async () => {
    const operator = await openSocket(sidecar.httpPort, await cookieFor(store.db, "operator@tapwright.test"));
    expect((await operator.next("hello")).role).toBe("operator");
    operator.send({ type: "subscribe", channel: STRAIN });
    operator.send({ type: "candidate.add", channel: STRAIN, id: "a", spec });
    const refusal = await operator.next("error");
    expect(refusal.code).toBe("forbidden");
    operator.send({ type: "subscribe", channel: 42 });
    expect((await operator.next("error")).code).toBe("bad_message");
    operator.ws.close();

    const engineer = await openSocket(sidecar.httpPort, await cookieFor(store.db, "engineer@tapwright.test"));
    engineer.send({ type: "candidate.add", channel: STRAIN, id: "a", spec });
    engineer.send({ type: "candidate.add", channel: STRAIN, id: "a", spec });
    expect((await engineer.next("error")).code).toBe("duplicate_candidate");
    for (const id of ["b", "c", "d", "e", "f", "g"]) engineer.send({ type: "candidate.add", channel: STRAIN, id, spec });
    expect((await engineer.next("error")).code).toBe("too_many_candidates");
    engineer.send({ type: "candidate.add", channel: STRAIN, id: "h", spec: { ...spec, sampleRateHz: 2000 } });
    expect((await engineer.next("error")).code).toBe("bad_spec");
    engineer.ws.close();
  });
});

describe("device authentication on the embedded broker (REQUIRE_DEVICE_AUTH=1)", () => {
  it("refuses connections without credentials or with a wrong password", async () => {
    await expect(connectDevice(sidecar.mqttUrl)).rejects.toThrow();
    await expect(connectDevice(sidecar.mqttUrl, { username: "env-node-1", password: "wrong" })).rejects.toThrow();
    await expect(connectDevice(sidecar.mqttUrl, { username: "bench", password: "wrong" })).rejects.toThrow();
  });

  it("lets a device publish its own channels and nothing of another device", async () => {
    const device = await connectDevice(sidecar.mqttUrl, { username: "env-node-1", password: "device-secret" });
    const before = sidecar.ingest.accepted.messages;
    await device.publishAsync(samplesTopic(STRAIN), Buffer.from(encodeBinarySamples({ seq: 0, t0: 0, sampleRateHz: 1000, values: [1, 2, 3] })));
    await until(() => sidecar.ingest.accepted.messages === before + 1, 5000, "the device's own message");
    // A publish outside its device is refused; aedes then closes the connection.
    const closed = new Promise<void>((resolve) => device.once("close", () => resolve()));
    device.publish(samplesTopic("hydraulic-press/press-ctl/ram-position"), Buffer.from(encodeBinarySamples({ seq: 0, t0: 0, sampleRateHz: 2000, values: [1] })));
    await closed;
    expect(sidecar.ingest.accepted.messages).toBe(before + 1);
    await device.endAsync(true);
  });

  it("accepts the internal credential", async () => {
    const internal = await connectDevice(sidecar.mqttUrl, { username: "bench", password: "internal-secret" });
    expect(internal.connected).toBe(true);
    await internal.endAsync();
  });
});
