import { spawn } from "node:child_process";
import http from "node:http";
import net from "node:net";
import { expect, test, type Page } from "@playwright/test";
import { BenchPage } from "./pages/bench-page";
import { APP_ORIGIN, SAME_ORIGIN } from "./pages/origin";
import { SetsPage } from "./pages/sets-page";
import { DEMO_PASSWORD, SignInPage } from "./pages/sign-in-page";

const CHANNEL = "hydraulic-press/env-node/frame-strain";

/** Everything the browser says about the Content-Security-Policy while the page is used: console lines and violation events. */
function watchCsp(page: Page): string[] {
  const seen: string[] = [];
  page.on("console", (msg) => {
    if (/Content Security Policy|Refused to (execute|load|apply|evaluate|connect|frame)/i.test(msg.text())) seen.push(`console: ${msg.text()}`);
  });
  page.on("pageerror", (err) => {
    if (/Content Security Policy|unsafe-eval/i.test(err.message)) seen.push(`error: ${err.message}`);
  });
  void page.addInitScript(() => {
    document.addEventListener("securitypolicyviolation", (e) => console.error(`Content Security Policy violation: ${e.violatedDirective} ${e.blockedURI}`));
  });
  return seen;
}

test("pages carry a nonce-based CSP and still work in Chromium with no violation: sign-in, the bench, the sets", async ({ page }) => {
  const violations = watchCsp(page);
  const response = await page.goto("/sign-in");
  const headers = response?.headers() ?? {};
  const csp = headers["content-security-policy"] ?? "";
  expect(csp).toMatch(/script-src 'self' 'nonce-[A-Za-z0-9+/=]{20,}' 'strict-dynamic'/);
  expect(csp).toContain("frame-ancestors 'none'");
  expect(csp).toContain("object-src 'none'");
  expect(csp).not.toContain("unsafe-eval");
  expect(csp).toMatch(/connect-src 'self' ws:\/\/127\.0\.0\.1:\d+/);
  expect(headers["x-content-type-options"]).toBe("nosniff");
  expect(headers["referrer-policy"]).toBe("same-origin");
  expect(headers["x-frame-options"]).toBe("DENY");
  const again = (await page.request.get("/sign-in")).headers()["content-security-policy"];
  expect(again).not.toBe(csp);

  await new SignInPage(page).signInAs("engineer");
  const bench = new BenchPage(page);
  await bench.open(CHANNEL);
  const candidate = await bench.addCandidate();
  await bench.closeEditor();
  await bench.expectTraceMoving(candidate);
  await bench.showView("Step");
  await page.screenshot({ path: "/tmp/tapwright-csp-bench.png", fullPage: true });

  const name = `CSP check ${Date.now()}`;
  const { setId } = await SetsPage.createThroughApi(page.request, {
    channel: CHANNEL,
    name,
    spec: { kind: "iir", family: "butterworth", response: "lowpass", order: 4, cutoffHz: 40, sampleRateHz: 1000 },
  });
  const sets = new SetsPage(page);
  await sets.openList();
  await page.getByRole("link", { name }).click();
  await expect(page).toHaveURL(new RegExp(`/sets/${setId}$`));
  await expect(page.getByTestId("set-name")).toHaveText(name);
  await page.screenshot({ path: "/tmp/tapwright-csp-set.png", fullPage: true });
  expect(violations).toEqual([]);
});

test("API answers are not stored, not sniffed and load nothing", async ({ page }) => {
  await new SignInPage(page).signInAs("operator");
  const res = await page.request.get("/api/v1/channels");
  expect(res.status()).toBe(200);
  expect(res.headers()["cache-control"]).toBe("no-store");
  expect(res.headers()["x-content-type-options"]).toBe("nosniff");
  expect(res.headers()["content-security-policy"]).toBe("default-src 'none'; frame-ancestors 'none'");
  const refused = await page.request.get("/api/v1/sets/2147483648");
  expect(refused.status()).toBe(400);
  expect(refused.headers()["cache-control"]).toBe("no-store");
});

function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const server = net.createServer();
    server.once("error", reject);
    server.listen(0, "127.0.0.1", () => {
      const { port } = server.address() as net.AddressInfo;
      server.close(() => resolve(port));
    });
  });
}

test("a page on another origin of the same host cannot change anything with the engineer's cookie", async ({ page }) => {
  await new SignInPage(page).signInAs("engineer");
  const port = await freePort();
  const attacker = http.createServer((_req, res) => res.writeHead(200, { "content-type": "text/html" }).end("<!doctype html><title>elsewhere</title>"));
  await new Promise<void>((resolve) => attacker.listen(port, "127.0.0.1", resolve));
  try {
    await page.goto(`http://127.0.0.1:${port}/`);
    const name = `Cross-site ${Date.now()}`;
    const body = JSON.stringify({ channel: CHANNEL, name, spec: { kind: "biquad", shape: "lowpass", centerHz: 50, q: 0.7, sampleRateHz: 1000 } });
    await page.evaluate(
      ([url, text]) => fetch(url, { method: "POST", mode: "no-cors", credentials: "include", headers: { "content-type": "text/plain" }, body: text }),
      [`${APP_ORIGIN}/api/v1/sets`, body] as const,
    );
    const direct = await page.request.post("/api/v1/sets", { data: body, headers: { "content-type": "text/plain", origin: `http://127.0.0.1:${port}` } });
    expect(direct.status()).toBe(403);
    expect((await direct.json()).error.message).toMatch(/Cross-site request refused/);
    const list = await (await page.request.get(`/api/v1/sets?q=${encodeURIComponent(name)}`)).json();
    expect(list.total ?? list.items?.length ?? 0).toBe(0);
  } finally {
    attacker.close();
  }
});

test("the session cookie is Secure when the app is served over HTTPS (APP_URL https)", async ({ request }) => {
  const port = await freePort();
  const child = spawn("node", ["--import", "tsx", "server/run/web.ts"], {
    env: { ...process.env, NODE_ENV: "production", HOST: "127.0.0.1", PORT: String(port), APP_URL: "https://tapwright.example" },
    stdio: "ignore",
  });
  try {
    const origin = `http://127.0.0.1:${port}`;
    let up = false;
    for (let i = 0; i < 120 && !up; i++) {
      up = Boolean(await request.get(`${origin}/api/health`).catch(() => undefined));
      if (!up) await new Promise((r) => setTimeout(r, 250));
    }
    const res = await request.post(`${origin}/api/auth/login`, {
      data: { email: "operator@tapwright.test", password: DEMO_PASSWORD },
      headers: { origin: "https://tapwright.example", "x-forwarded-for": "198.51.100.7" },
    });
    expect(res.status()).toBe(200);
    const cookies = res.headersArray().filter((h) => h.name.toLowerCase() === "set-cookie").map((h) => h.value);
    expect(cookies.find((c) => c.startsWith("tapwright_session="))).toMatch(/;\s*Secure/i);
    expect((await request.get(`${origin}/sign-in`)).headers()["strict-transport-security"]).toMatch(/max-age=\d+/);
  } finally {
    child.kill("SIGTERM");
  }
});

test("a same-origin API call still works (the app's own pages)", async ({ page }) => {
  await new SignInPage(page).signInAs("engineer");
  const res = await page.request.post("/api/v1/sets", {
    headers: SAME_ORIGIN,
    data: { channel: CHANNEL, name: `Same origin ${Date.now()}`, spec: { kind: "biquad", shape: "lowpass", centerHz: 50, q: 0.7, sampleRateHz: 1000 } },
  });
  expect(res.status()).toBe(201);
});
