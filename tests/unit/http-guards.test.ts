import { describe, expect, it } from "vitest";
import { bodyTooLarge, readJson, readLimited } from "@/lib/http/body";
import { clientAddress, trustedProxies } from "@/lib/http/client-address";
import { contentSecurityPolicy, hostName } from "@/lib/http/csp";
import { calendarDay, dbId, MAX_DB_ID, safeParseInput, unstorableTextAt } from "@/lib/http/fields";
import { crossSiteRefusal } from "@/lib/http/origin";
import { z } from "zod";

describe("client address through trusted proxies", () => {
  const none = trustedProxies("");
  const proxies = trustedProxies("10.0.0.0/8, 127.0.0.1, ::1");

  it("is the socket's peer (the last entry, which the web server appends) when no proxy is trusted", () => {
    expect(clientAddress("6.6.6.6, 127.0.0.1", none)).toBe("127.0.0.1");
    expect(clientAddress("127.0.0.1", none)).toBe("127.0.0.1");
  });

  it("walks left only through trusted proxies, so a client's own header entries are never believed", () => {
    expect(clientAddress("203.0.113.9, 10.1.2.3", proxies)).toBe("203.0.113.9");
    expect(clientAddress("1.1.1.1, 203.0.113.9, 10.1.2.3", proxies)).toBe("203.0.113.9");
    expect(clientAddress("203.0.113.9, 10.9.9.9, 127.0.0.1", proxies)).toBe("203.0.113.9");
    expect(clientAddress("10.1.1.1, 127.0.0.1", proxies)).toBe("10.1.1.1");
  });

  it("reads IPv4-mapped IPv6 peers as IPv4 and refuses a garbled chain", () => {
    expect(clientAddress("198.51.100.4, ::ffff:127.0.0.1", proxies)).toBe("198.51.100.4");
    expect(clientAddress("not-an-address, 127.0.0.1", proxies)).toBeNull();
    expect(clientAddress(null, proxies)).toBeNull();
  });

  it("refuses a TRUSTED_PROXIES entry that is not an address or a block", () => {
    expect(() => trustedProxies("10.0.0.0/8, proxy.lan")).toThrow(/"proxy.lan" is not an address or CIDR block/);
  });
});

describe("cross-site refusal", () => {
  const app = "http://127.0.0.1:3000";
  const refusal = (h: Record<string, string>, opts = {}) => crossSiteRefusal(new Headers(h), app, opts);

  it("accepts the app's own Origin (its Host or APP_URL), Sec-Fetch-Site same-origin, or its own Referer", () => {
    expect(refusal({ origin: "http://localhost:3000", host: "localhost:3000" })).toBeNull();
    expect(refusal({ origin: "http://127.0.0.1:3000" })).toBeNull();
    expect(refusal({ "sec-fetch-site": "same-origin" })).toBeNull();
    expect(refusal({ referer: "http://127.0.0.1:3000/sets/4" })).toBeNull();
  });

  it("refuses other origins, other sites and requests that say nothing about where they come from", () => {
    expect(refusal({ origin: "http://127.0.0.1:3001", host: "127.0.0.1:3000" })).toMatch(/127\.0\.0\.1:3001/);
    expect(refusal({ origin: "null" })).toMatch(/opaque/);
    expect(refusal({ "sec-fetch-site": "same-site" })).toMatch(/same-site/);
    expect(refusal({ referer: "https://elsewhere.example/" })).toMatch(/another site/);
    expect(refusal({})).toMatch(/neither/);
  });

  it("leaves API-token requests to their token, except where an Origin is required (server actions)", () => {
    expect(refusal({ authorization: "Bearer tw_x" })).toBeNull();
    expect(refusal({ authorization: "Bearer tw_x" }, { originRequired: true })).toMatch(/Origin/);
    expect(refusal({ "sec-fetch-site": "same-origin" }, { originRequired: true })).toMatch(/Origin/);
  });
});

describe("the pages' Content-Security-Policy", () => {
  it("allows the nonce and the sidecar's WebSocket on the page's host, and nothing inline or evaluated", () => {
    const csp = contentSecurityPolicy({ nonce: "abc123", host: "127.0.0.1", sidecarPort: 3001, https: false });
    expect(csp).toContain("script-src 'self' 'nonce-abc123' 'strict-dynamic'");
    expect(csp).toContain("connect-src 'self' ws://127.0.0.1:3001");
    expect(csp).toContain("frame-ancestors 'none'");
    expect(csp).not.toMatch(/unsafe-eval|script-src[^;]*unsafe-inline/);
    expect(contentSecurityPolicy({ nonce: "n", host: "tapwright.example", sidecarPort: 443, https: true })).toMatch(/wss:\/\/tapwright\.example:443.*upgrade-insecure-requests/);
  });

  it("leaves out a host that could inject into the header", () => {
    expect(contentSecurityPolicy({ nonce: "n", host: "x; script-src *", sidecarPort: 1, https: false })).toContain("connect-src 'self';");
    expect(hostName("[::1]:3000")).toBe("[::1]");
    expect(hostName("localhost:3000")).toBe("localhost");
  });
});

describe("shared field checks", () => {
  it("caps ids at 2³¹ − 1, the integer columns' range", () => {
    expect(dbId.safeParse(String(MAX_DB_ID)).success).toBe(true);
    expect(dbId.safeParse("2147483648").success).toBe(false);
    expect(dbId.safeParse("1e10").success).toBe(false);
    expect(dbId.safeParse("0").success).toBe(false);
  });

  it("accepts only calendar days that exist", () => {
    expect(calendarDay.safeParse("2028-02-29").success).toBe(true);
    for (const day of ["2026-02-29", "2026-02-30", "2026-13-01", "2026-00-10", "2026-4-1"]) expect(calendarDay.safeParse(day).success, day).toBe(false);
  });

  it("finds a NUL or a lone surrogate anywhere in a value, keys included, and reports where", () => {
    expect(unstorableTextAt({ name: "ok", nested: [{ note: "a\u0000b" }] })).toBe("nested.0.note");
    expect(unstorableTextAt({ ["k\uD800"]: 1 })).toBe("k\uD800");
    expect(unstorableTextAt(["\uDC00x"])).toBe("0");
    expect(unstorableTextAt({ emoji: "🎛️ ok", text: "ünïcödé" })).toBeNull();
    const parsed = safeParseInput(z.object({ name: z.string() }), { name: "x\u0000" });
    expect(parsed.success).toBe(false);
    expect(parsed.error?.issues[0]).toMatchObject({ path: ["name"], message: expect.stringMatching(/NUL/) });
  });
});

describe("bounded bodies", () => {
  const stream = (chunks: number, size: number) =>
    new ReadableStream<Uint8Array>({
      start(c) {
        for (let i = 0; i < chunks; i++) c.enqueue(new Uint8Array(size).fill(32));
        c.close();
      },
    });

  it("refuses from Content-Length before reading, and while streaming whatever the header says", async () => {
    const tooLarge = (n: number | null) => bodyTooLarge("A request body", 1000, n);
    const declared = new Request("http://x.test", { method: "POST", body: "{}", headers: { "content-length": "5000" } });
    await expect(readLimited(declared, 1000, tooLarge)).rejects.toMatchObject({ code: "too_large", message: expect.stringMatching(/this one is 0\.0 MB/) });
    const streamed = new Request("http://x.test", { method: "POST", body: stream(10, 200), duplex: "half" } as RequestInit);
    await expect(readLimited(streamed, 1000, tooLarge)).rejects.toMatchObject({ code: "too_large", message: expect.stringMatching(/larger than that/) });
  });

  it("parses JSON within the limit and refuses what is not UTF-8 JSON with 400", async () => {
    expect(await readJson(new Request("http://x.test", { method: "POST", body: '{"a":1}' }), 1000)).toEqual({ a: 1 });
    await expect(readJson(new Request("http://x.test", { method: "POST", body: new Uint8Array([0xff, 0xfe]) }), 1000)).rejects.toMatchObject({ code: "bad_request" });
    await expect(readJson(new Request("http://x.test", { method: "POST", body: "{oops" }), 1000)).rejects.toMatchObject({ code: "bad_request" });
  });
});
