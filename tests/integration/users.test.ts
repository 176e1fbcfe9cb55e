import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Db } from "@/db/client";
import { listChannels, findChannelByPath } from "@/db/queries/channels";
import { seedDemo } from "@/db/seed";
import { createSession, liveSessionAccount, revokeSession } from "@/db/queries/sessions";
import { findUserByEmail, insertUser, updateUser } from "@/db/queries/users";
import { releaseLoginAttempt, reserveLoginAttempt } from "@/db/queries/login-throttle";
import { resolveSessionUser } from "@/lib/auth/guard";
import { attemptKeys, type ThrottlePolicy } from "@/lib/auth/throttle";
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

  it("counts parallel sign-in attempts one by one: only the free ones go ahead", async () => {
    const policy: ThrottlePolicy = { freePerAccount: 5, freePerAddress: 20, baseMs: 60_000, maxMs: 900_000 };
    const keys = attemptKeys("parallel@example.test", "203.0.113.50", null);
    const waits = await Promise.all(Array.from({ length: 40 }, () => reserveLoginAttempt(db, keys, policy)));
    // The first try from a fresh address, then the account's five free ones; the sixth sets a minute's wait.
    expect(waits.filter((w) => w === 0)).toHaveLength(6);
    expect(waits.filter((w) => w > 55_000 && w <= 60_000)).toHaveLength(34);
    const row = await db.selectFrom("login_throttle").select(["failures"]).where("key", "=", keys.account).executeTakeFirstOrThrow();
    expect(row.failures).toBe(6);
  });

  it("lets the account's owner back in from a fresh address and starts the account's count over", async () => {
    const policy: ThrottlePolicy = { freePerAccount: 2, freePerAddress: 20, baseMs: 60_000, maxMs: 900_000 };
    const guesser = attemptKeys("owner@example.test", "203.0.113.60", null);
    for (let i = 0; i < 3; i++) expect(await reserveLoginAttempt(db, guesser, policy)).toBe(0);
    expect(await reserveLoginAttempt(db, guesser, policy)).toBeGreaterThan(0);
    const owner = attemptKeys("owner@example.test", "198.51.100.60", null);
    expect(await reserveLoginAttempt(db, owner, policy)).toBe(0);
    await releaseLoginAttempt(db, owner, policy);
    expect(await db.selectFrom("login_throttle").select("key").where("key", "=", owner.account).executeTakeFirst()).toBeUndefined();
    const address = await db.selectFrom("login_throttle").select(["failures"]).where("key", "=", owner.address!).executeTakeFirstOrThrow();
    expect(address.failures).toBe(0);
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
