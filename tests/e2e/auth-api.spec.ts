import { spawn, type ChildProcess } from "node:child_process";
import net from "node:net";
import { expect, test, type APIRequestContext } from "@playwright/test";
import { createDb, type Db } from "@/db/client";
import { insertUser, updateUser } from "@/db/queries/users";
import { hashPassword } from "@/lib/auth/password";
import { SAME_ORIGIN } from "./pages/origin";
import { SignInPage } from "./pages/sign-in-page";

let db: Db;
test.beforeAll(() => {
  db = createDb(process.env.DATABASE_URL ?? "postgres://postgres@127.0.0.1:5433/tapwright_e2e", 2);
});
test.afterAll(() => db.destroy());

/** A client address of this test's own (the e2e server believes X-Forwarded-For from loopback). */
const address = (() => {
  let n = 0;
  return () => `10.${77 + (n++ % 100)}.${Date.now() % 250}.${(process.pid + n) % 250}`;
})();

function login(request: APIRequestContext, email: string, password: string, from?: string) {
  return request.post("/api/auth/login", { data: { email, password }, headers: { ...SAME_ORIGIN, ...(from ? { "x-forwarded-for": from } : {}) } });
}

async function temporaryUser(label: string) {
  const email = `${label}-${Date.now()}@example.test`;
  const user = await insertUser(db, { email, displayName: label, passwordHash: await hashPassword("long enough password"), role: "engineer" });
  return { user, email, password: "long enough password" };
}

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

/** A second web server on a free port with its own environment; resolves once it answers /api/health. */
async function webServer(request: APIRequestContext, env: Record<string, string>): Promise<{ origin: string; process: ChildProcess }> {
  const port = await freePort();
  const child = spawn("node", ["--import", "tsx", "server/run/web.ts"], {
    env: { ...process.env, NODE_ENV: "production", HOST: "127.0.0.1", PORT: String(port), ...env },
    stdio: "ignore",
  });
  const origin = `http://127.0.0.1:${port}`;
  for (let i = 0; i < 120; i++) {
    if (await request.get(`${origin}/api/health`).catch(() => undefined)) return { origin, process: child };
    await new Promise((r) => setTimeout(r, 250));
  }
  child.kill("SIGTERM");
  throw new Error("the second web server did not start");
}

test("login answers 400 with zod paths for malformed input", async ({ request }) => {
  const notJson = await request.post("/api/auth/login", { data: "{oops", headers: { "content-type": "application/json", ...SAME_ORIGIN } });
  expect(notJson.status()).toBe(400);
  const fields = await request.post("/api/auth/login", { data: { email: "not-an-email", password: "" }, headers: SAME_ORIGIN });
  expect(fields.status()).toBe(400);
  const body = await fields.json();
  expect(body.error.details.map((d: { path: string }) => d.path).sort()).toEqual(["email", "password"]);
});

test("me returns who is signed in; signing out ends the session for every copy of its cookie", async ({ request, playwright, baseURL }) => {
  expect((await login(request, "lead@tapwright.test", "tapwright-demo")).status()).toBe(200);
  expect(await (await request.get("/api/auth/me")).json()).toEqual({ email: "lead@tapwright.test", name: "Demo Lead", role: "lead" });
  const channels = await (await request.get("/api/v1/channels")).json();
  expect(channels).toContainEqual({ path: "hydraulic-press/press-ctl/ram-position", name: "Ram position", unit: "mm", sampleRateHz: 2000 });
  const copy = await playwright.request.newContext({ baseURL, storageState: await request.storageState() });
  expect((await copy.get("/api/auth/me")).status()).toBe(200);
  expect((await request.post("/api/auth/logout", { headers: SAME_ORIGIN })).status()).toBe(200);
  expect((await request.get("/api/auth/me")).status()).toBe(401);
  expect((await copy.get("/api/auth/me")).status()).toBe(401);
  await copy.dispose();
});

test("an account's failures slow down the failing address with growing delays, never a fresh one", async ({ request }) => {
  const { email, password } = await temporaryUser("throttled");
  const guesser = address();
  for (let i = 0; i < 6; i++) expect((await login(request, email, "wrong password", guesser)).status()).toBe(401);
  const refused = await login(request, email, password, guesser);
  expect(refused.status()).toBe(429);
  expect(Number(refused.headers()["retry-after"])).toBeGreaterThanOrEqual(1);
  expect((await refused.json()).error).toMatchObject({ code: "too_many_requests", message: expect.stringMatching(/Try again in \d+ s/) });
  expect((await login(request, email, password, address())).status()).toBe(200);
});

test("strangers failing from the owner's address do not lock out a browser that signed in before", async ({ playwright, baseURL }) => {
  const { email, password } = await temporaryUser("owner");
  const shared = address();
  const owner = await playwright.request.newContext({ baseURL });
  expect((await login(owner, email, password, shared)).status()).toBe(200);
  expect((await owner.post("/api/auth/logout", { headers: SAME_ORIGIN })).status()).toBe(200);
  const stranger = await playwright.request.newContext({ baseURL });
  for (let i = 0; i < 25; i++) await login(stranger, `made-up-${i}-${Date.now()}@example.test`, "guess", shared);
  for (let i = 0; i < 6; i++) await login(stranger, email, "guess", shared);
  expect((await login(stranger, email, password, shared)).status()).toBe(429);
  expect((await login(owner, email, password, shared)).status()).toBe(200);
  await owner.dispose();
  await stranger.dispose();
});

test("parallel wrong passwords are counted one by one: at most the free ones are checked", async ({ request }) => {
  const { email } = await temporaryUser("parallel");
  const from = address();
  const statuses = await Promise.all(Array.from({ length: 40 }, () => login(request, email, "wrong password", from).then((r) => r.status())));
  // The first try from a fresh address, then the account's 5 free failures (LOGIN_FREE_FAILURES); the delays only grow after that.
  expect(statuses.filter((s) => s === 401).length).toBeLessThanOrEqual(7);
  expect(statuses.filter((s) => s === 429).length).toBeGreaterThanOrEqual(33);
  expect(statuses.every((s) => s === 401 || s === 429)).toBe(true);
});

test("a client cannot pick its address with X-Forwarded-For unless the server trusts its proxy", async ({ request }) => {
  const clear = () => db.deleteFrom("login_throttle").where("key", "=", "address:127.0.0.1").execute();
  await clear();
  const server = await webServer(request, { TRUSTED_PROXIES: "", LOGIN_DELAY_BASE_MS: "5000" });
  try {
    const post = (i: number) =>
      request.post(`${server.origin}/api/auth/login`, {
        data: { email: `rotating-${i}-${Date.now()}@example.test`, password: "guess" },
        headers: { origin: server.origin, "x-forwarded-for": `192.0.2.${i}` },
      });
    const statuses: number[] = [];
    for (let i = 0; i < 24; i++) statuses.push((await post(i)).status());
    expect(statuses.slice(0, 20).every((s) => s === 401)).toBe(true);
    expect(statuses.slice(21)).toContain(429);
  } finally {
    server.process.kill("SIGTERM");
    // The rotating client above counted on the loopback address this run's browsers sign in from.
    await clear();
  }
});

test("disabling a user or changing the password ends their sessions", async ({ playwright, baseURL }) => {
  for (const change of [{ disabled: true }, { passwordHash: "scrypt$1$1$1$AA==$AA==" }]) {
    const { user, email, password } = await temporaryUser("ended");
    const request = await playwright.request.newContext({ baseURL });
    expect((await login(request, email, password)).status()).toBe(200);
    expect((await request.get("/api/auth/me")).status()).toBe(200);
    await updateUser(db, user.id, change);
    expect((await request.get("/api/auth/me")).status()).toBe(401);
    expect((await request.get("/api/v1/channels")).status()).toBe(401);
    await request.dispose();
  }
});

test("with the database down, health says 503 in plain words and pages show the app's own page", async ({ request, page }) => {
  expect(await (await request.get("/api/health")).json()).toEqual({ status: "ok", db: "up" });
  // A session cookie from this run's server: cookies belong to the host, so the second server receives it too.
  await new SignInPage(page).signInAs("engineer");
  const server = await webServer(request, { DATABASE_URL: "postgres://nobody:x@127.0.0.1:1/none" });
  try {
    const health = await request.get(`${server.origin}/api/health`);
    expect(health.status()).toBe(503);
    expect(await health.text()).toMatch(/^Database unavailable/);
    const signIn = await request.post(`${server.origin}/api/auth/login`, { data: { email: "a@b.test", password: "x" }, headers: { origin: server.origin } });
    expect(signIn.status()).toBe(503);
    expect((await signIn.json()).error.message).toMatch(/database/i);
    for (const path of ["/", "/sets", "/channels/hydraulic-press/env-node/frame-strain"]) {
      await page.goto(`${server.origin}${path}`);
      await expect(page.getByRole("heading", { name: "The database cannot be reached; the live view keeps running." })).toBeVisible();
      await expect(page.getByText(/digest|Application error/i)).toHaveCount(0);
    }
    await page.context().clearCookies();
    await page.goto(`${server.origin}/sign-in`);
    await expect(page.getByRole("heading", { name: "The database cannot be reached; the live view keeps running." })).toBeVisible();
    await page.screenshot({ path: "/tmp/tapwright-database-down.png" });
  } finally {
    server.process.kill("SIGTERM");
  }
});
