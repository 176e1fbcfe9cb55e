import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Db } from "@/db/client";
import { listChannels, findChannelByPath } from "@/db/queries/channels";
import { seedDemo } from "@/db/seed";
import { createSession, liveSessionAccount, revokeSession } from "@/db/queries/sessions";
import { findUserByEmail, insertUser, updateUser } from "@/db/queries/users";
import { resolveSessionUser } from "@/lib/auth/guard";
import { freshDb } from "./support/fresh-db";

let db: Db;
let close: () => Promise<void>;

beforeAll(async () => {
  ({ db, close } = await freshDb("users"));
  await seedDemo(db, "tapwright-demo");
});
afterAll(() => close());

describe("accounts and sessions", () => {
  it("ends every session when a password changes or the user is disabled, and one session when it is revoked", async () => {
    const user = await insertUser(db, { email: "Temp@Example.test", displayName: "Temp", passwordHash: "x", role: "engineer" });
    expect(user.email).toBe("temp@example.test");
    const sessionId = await createSession(db, user.id, 3600);
    const cookie = { userId: user.id, sessionVersion: user.session_version, sessionId };
    const check = async (c = cookie) => resolveSessionUser(c, await liveSessionAccount(db, c.sessionId));
    expect((await check())?.role).toBe("engineer");

    await updateUser(db, user.id, { role: "lead" });
    expect((await check())?.role).toBe("lead");

    const repassworded = await updateUser(db, user.id, { passwordHash: "y" });
    expect(await check()).toBeNull();

    const fresh = { userId: user.id, sessionVersion: repassworded!.session_version, sessionId: await createSession(db, user.id, 3600) };
    const other = { ...fresh, sessionId: await createSession(db, user.id, 3600) };
    expect(await check(fresh)).not.toBeNull();
    await revokeSession(db, fresh.sessionId);
    expect(await check(fresh)).toBeNull();
    expect(await check(other)).not.toBeNull();

    await updateUser(db, user.id, { disabled: true });
    expect(await check(other)).toBeNull();
  });

  it("does not accept an expired stored session", async () => {
    const user = await findUserByEmail(db, "operator@tapwright.test");
    const sessionId = await createSession(db, user!.id, 3600);
    await db.updateTable("sessions").set({ expires_at: new Date(Date.now() - 1000) }).where("id", "=", sessionId).execute();
    expect(await liveSessionAccount(db, sessionId)).toBeUndefined();
  });

  it("finds accounts by e-mail regardless of case", async () => {
    expect((await findUserByEmail(db, "LEAD@tapwright.test"))?.role).toBe("lead");
  });
});

describe("channels", () => {
  it("address every channel by its rig/device/channel path", async () => {
    const channels = await listChannels(db);
    expect(channels.length).toBeGreaterThanOrEqual(8);
    const rates = channels.map((c) => c.sampleRateHz);
    expect(Math.min(...rates)).toBe(100);
    expect(Math.max(...rates)).toBe(5000);
    const one = await findChannelByPath(db, "gearbox-endurance/torque-node/input-torque");
    expect(one).toMatchObject({ unit: "N·m", sampleRateHz: 1000, coefficientFormat: "q15" });
    expect(await findChannelByPath(db, "gearbox-endurance/torque-node")).toBeUndefined();
    expect(await findChannelByPath(db, "a/b/c/d")).toBeUndefined();
  });
});
