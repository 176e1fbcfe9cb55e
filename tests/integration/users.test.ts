import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Db } from "@/db/client";
import { listChannels, findChannelByPath } from "@/db/queries/channels";
import { seedDemo } from "@/db/seed";
import {
  clearLoginFailures, countLoginFailures, findUserByEmail, insertUser, recordLoginFailure, updateUser,
} from "@/db/queries/users";
import { resolveSessionUser } from "@/lib/auth/guard";
import { isThrottled, THROTTLE } from "@/lib/auth/throttle";
import { freshDb } from "./support/fresh-db";

let db: Db;
let close: () => Promise<void>;

beforeAll(async () => {
  ({ db, close } = await freshDb("users"));
  await seedDemo(db, "tapwright-demo");
});
afterAll(() => close());

describe("accounts and sessions", () => {
  it("ends every session when a password changes or the user is disabled", async () => {
    const user = await insertUser(db, { email: "Temp@Example.test", displayName: "Temp", passwordHash: "x", role: "engineer" });
    expect(user.email).toBe("temp@example.test");
    const cookie = { userId: user.id, sessionVersion: user.session_version };
    expect(resolveSessionUser(cookie, user)?.role).toBe("engineer");

    const renamed = await updateUser(db, user.id, { role: "lead" });
    expect(resolveSessionUser(cookie, renamed)?.role).toBe("lead");

    const repassworded = await updateUser(db, user.id, { passwordHash: "y" });
    expect(resolveSessionUser(cookie, repassworded)).toBeNull();

    const fresh = { userId: user.id, sessionVersion: repassworded!.session_version };
    const disabled = await updateUser(db, user.id, { disabled: true });
    expect(resolveSessionUser(fresh, disabled)).toBeNull();
  });

  it("counts sign-in failures per account and per known address, and throttles", async () => {
    const email = "victim@example.test";
    for (let i = 0; i < THROTTLE.maxPerAccount; i++) await recordLoginFailure(db, email, i % 2 ? "10.9.8.7" : null);
    const counts = await countLoginFailures(db, email, "10.9.8.7", THROTTLE.windowMs);
    expect(counts.account).toBe(THROTTLE.maxPerAccount);
    expect(counts.address).toBe(Math.floor(THROTTLE.maxPerAccount / 2));
    expect(isThrottled(counts)).toBe(true);
    expect(await countLoginFailures(db, "other@example.test", null, THROTTLE.windowMs)).toEqual({ account: 0, address: 0 });
    await clearLoginFailures(db, email);
    expect(isThrottled(await countLoginFailures(db, email, "10.9.8.7", THROTTLE.windowMs))).toBe(false);
  });

  it("ignores failures older than the window", async () => {
    await db.insertInto("login_failures").values({ email: "old@example.test", address: "", at: new Date(Date.now() - THROTTLE.windowMs - 1000) }).execute();
    expect((await countLoginFailures(db, "old@example.test", null, THROTTLE.windowMs)).account).toBe(0);
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
