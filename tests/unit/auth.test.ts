import { describe, expect, it } from "vitest";
import { requireRole, resolveSessionUser, type StoredAccount } from "@/lib/auth/guard";
import { hashPassword, verifyPassword } from "@/lib/auth/password";
import { roleAtLeast, ROLES } from "@/lib/auth/roles";
import { isThrottled, THROTTLE } from "@/lib/auth/throttle";
import { AppError, toErrorBody } from "@/lib/errors";

const account: StoredAccount = { id: 7, email: "e@x.test", display_name: "E", role: "engineer", disabled: false, session_version: 3 };

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
  it("accepts a cookie whose account is enabled and whose version matches", () => {
    expect(resolveSessionUser({ userId: 7, sessionVersion: 3 }, account)).toEqual({ id: 7, email: "e@x.test", name: "E", role: "engineer" });
  });

  it("refuses missing, disabled, stale or mismatched sessions", () => {
    expect(resolveSessionUser({}, account)).toBeNull();
    expect(resolveSessionUser({ userId: 7, sessionVersion: 3 }, undefined)).toBeNull();
    expect(resolveSessionUser({ userId: 7, sessionVersion: 3 }, { ...account, disabled: true })).toBeNull();
    expect(resolveSessionUser({ userId: 7, sessionVersion: 2 }, account)).toBeNull();
    expect(resolveSessionUser({ userId: 8, sessionVersion: 3 }, account)).toBeNull();
  });

  it("answers 401 without a user and 403 below the role", () => {
    const user = resolveSessionUser({ userId: 7, sessionVersion: 3 }, account);
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
  it("refuses once an account or an address reaches its limit", () => {
    expect(isThrottled({ account: THROTTLE.maxPerAccount - 1, address: 0 })).toBe(false);
    expect(isThrottled({ account: THROTTLE.maxPerAccount, address: 0 })).toBe(true);
    expect(isThrottled({ account: 0, address: THROTTLE.maxPerAddress })).toBe(true);
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
