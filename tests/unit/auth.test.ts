import { describe, expect, it } from "vitest";
import { requireRole, resolveSessionUser, type StoredSession } from "@/lib/auth/guard";
import { hashPassword, verifyPassword } from "@/lib/auth/password";
import { roleAtLeast, ROLES } from "@/lib/auth/roles";
import { attemptKeys, delayAfter, FORGET_AFTER_MS, waitMs, withFailure, type Counter, type ThrottlePolicy } from "@/lib/auth/throttle";
import { AppError, toErrorBody } from "@/lib/errors";

const account: StoredSession = { id: 7, email: "e@x.test", display_name: "E", role: "engineer", disabled: false, session_version: 3, session_id: "s-7" };
const cookie = { userId: 7, sessionVersion: 3, sessionId: "s-7" };

describe("password hashing (scrypt, RFC 7914)", () => {
  it("verifies the right password and refuses a wrong one", async () => {
    const hash = await hashPassword("correct horse battery");
    expect(hash).toMatch(/^scrypt\$32768\$8\$1\$/);
    expect(await verifyPassword("correct horse battery", hash)).toBe(true);
    expect(await verifyPassword("correct horse batterY", hash)).toBe(false);
  });

  it("salts every hash", async () => {
    expect(await hashPassword("same")).not.toBe(await hashPassword("same"));
  });

  it("treats malformed stored hashes as a mismatch", async () => {
    for (const bad of ["", "plain", "scrypt$x$8$1$AA==$AA==", "bcrypt$1$2$3$4$5", "scrypt$32768$8$1$AAAA$AAAA"]) {
      expect(await verifyPassword("pw", bad)).toBe(false);
    }
  });
});

describe("the session guard", () => {
  it("accepts a cookie whose stored session is live, whose account is enabled and whose version matches", () => {
    expect(resolveSessionUser(cookie, account)).toEqual({ id: 7, email: "e@x.test", name: "E", role: "engineer" });
  });

  it("refuses missing, revoked, disabled, stale or mismatched sessions", () => {
    expect(resolveSessionUser({}, account)).toBeNull();
    expect(resolveSessionUser(cookie, undefined)).toBeNull();
    expect(resolveSessionUser({ userId: 7, sessionVersion: 3 }, account)).toBeNull();
    expect(resolveSessionUser({ ...cookie, sessionId: "s-other" }, account)).toBeNull();
    expect(resolveSessionUser(cookie, { ...account, disabled: true })).toBeNull();
    expect(resolveSessionUser({ ...cookie, sessionVersion: 2 }, account)).toBeNull();
    expect(resolveSessionUser({ ...cookie, userId: 8 }, account)).toBeNull();
  });

  it("answers 401 without a user and 403 below the role", () => {
    const user = resolveSessionUser(cookie, account);
    expect(() => requireRole(null, "operator")).toThrow(expect.objectContaining({ code: "unauthorized" }));
    expect(() => requireRole(user, "lead")).toThrow(expect.objectContaining({ code: "forbidden" }));
    expect(requireRole(user, "engineer")).toBe(user);
    expect(requireRole(user, "operator")).toBe(user);
  });

  it("orders roles operator < engineer < lead < admin", () => {
    for (const [i, a] of ROLES.entries()) for (const [j, b] of ROLES.entries()) expect(roleAtLeast(a, b)).toBe(i >= j);
  });
});

describe("sign-in throttling policy", () => {
  const policy: ThrottlePolicy = { freePerAccount: 5, freePerAddress: 20, baseMs: 1000, maxMs: 900_000 };
  const now = 1_000_000_000;
  const failed = (n: number, free: number): Counter => {
    let c: Counter | undefined;
    for (let i = 0; i < n; i++) c = withFailure(c, free, policy, now);
    return c ?? { failures: 0, lastFailureAt: now, blockedUntil: null };
  };

  it("lets the free failures through, then doubles the delay from 1 s up to 15 min", () => {
    expect([5, 6, 7, 8, 16, 100].map((n) => delayAfter(n, 5, policy))).toEqual([0, 1000, 2000, 4000, 900_000, 900_000]);
    expect(failed(5, 5).blockedUntil).toBeNull();
    expect(failed(6, 5).blockedUntil).toBe(now + 1000);
  });

  it("forgets a key's failures a day after the last one", () => {
    expect(withFailure(failed(9, 5), 5, policy, now + FORGET_AFTER_MS + 1)).toEqual({ failures: 1, lastFailureAt: now + FORGET_AFTER_MS + 1, blockedUntil: null });
  });

  it("holds back a browser that has signed in before only by its own failures", () => {
    const keys = attemptKeys("Lead@x.test", "10.0.0.1", "dev-1");
    const counters = new Map([[keys.account, failed(30, 5)], [keys.address!, failed(30, 20)], [keys.device!, failed(0, 5)]]);
    expect(waitMs(keys, counters, now)).toBe(0);
    counters.set(keys.device!, failed(6, 5));
    expect(waitMs(keys, counters, now)).toBe(1000);
  });

  it("holds back other attempts by their address, and by the account only once that address has failed", () => {
    const fresh = attemptKeys("lead@x.test", "10.0.0.2", null);
    const counters = new Map([[fresh.account, failed(12, 5)]]);
    expect(waitMs(fresh, counters, now)).toBe(0);
    counters.set(fresh.address!, failed(1, 20));
    expect(waitMs(fresh, counters, now)).toBe(delayAfter(12, 5, policy));
    counters.set(fresh.account, failed(0, 5)).set(fresh.address!, failed(25, 20));
    expect(waitMs(fresh, counters, now)).toBe(delayAfter(25, 20, policy));
  });
});

describe("error mapping", () => {
  it("maps app errors to their status and hides everything else", () => {
    expect(toErrorBody(new AppError("conflict", "Stale form."))).toEqual({ status: 409, body: { error: { code: "conflict", message: "Stale form." } } });
    const hidden = toErrorBody(new Error("secret stack detail"));
    expect(hidden.status).toBe(500);
    expect(JSON.stringify(hidden.body)).not.toContain("secret");
  });

  it("recognises an unreachable database as 503", () => {
    const refused = Object.assign(new Error("connect ECONNREFUSED 127.0.0.1:1"), { code: "ECONNREFUSED" });
    expect(toErrorBody(refused).status).toBe(503);
    expect(toErrorBody(new AggregateError([refused])).status).toBe(503);
  });
});
