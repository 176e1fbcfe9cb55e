import { sealData } from "iron-session";
import { describe, expect, it } from "vitest";
import { unsealSessionCookie } from "@/lib/auth/session-unseal";

const SECRET = "a".repeat(32);
const OTHER = "b".repeat(32);

describe("unsealSessionCookie", () => {
  it("opens a sealed session and answers the same again from memory", async () => {
    const sealed = await sealData({ userId: 7, sessionVersion: 2, sessionId: "s-1" }, { password: SECRET, ttl: 3600 });
    expect(await unsealSessionCookie(sealed, SECRET, 3600)).toEqual({ userId: 7, sessionVersion: 2, sessionId: "s-1" });
    const again = await unsealSessionCookie(sealed, SECRET, 3600);
    expect(again).toEqual({ userId: 7, sessionVersion: 2, sessionId: "s-1" });
    again.userId = 1; // a caller's copy: changing it must not change what the next request sees
    expect((await unsealSessionCookie(sealed, SECRET, 3600)).userId).toBe(7);
  });

  it("never opens a cookie sealed with another secret, even after it was opened with its own", async () => {
    const sealed = await sealData({ userId: 7, sessionId: "s-2" }, { password: SECRET, ttl: 3600 });
    expect((await unsealSessionCookie(sealed, SECRET, 3600)).userId).toBe(7);
    expect(await unsealSessionCookie(sealed, OTHER, 3600)).toEqual({});
  });

  it("gives no session for forged, truncated or empty text instead of throwing", async () => {
    const sealed = await sealData({ userId: 7, sessionId: "s-3" }, { password: SECRET, ttl: 3600 });
    expect(await unsealSessionCookie(`${sealed.slice(0, -4)}AAAA`, SECRET, 3600)).toEqual({});
    expect(await unsealSessionCookie(sealed.slice(0, 20), SECRET, 3600)).toEqual({});
    expect(await unsealSessionCookie("", SECRET, 3600)).toEqual({});
  });
});
