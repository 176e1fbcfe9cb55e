import { spawn } from "node:child_process";
import { expect, test, type APIRequestContext } from "@playwright/test";
import { createDb, type Db } from "@/db/client";
import { insertUser, updateUser } from "@/db/queries/users";
import { hashPassword } from "@/lib/auth/password";

let db: Db;
test.beforeAll(() => {
  db = createDb(process.env.DATABASE_URL ?? "postgres://postgres@127.0.0.1:5433/tapwright_e2e", 2);
});
test.afterAll(() => db.destroy());

function login(request: APIRequestContext, email: string, password: string, headers: Record<string, string> = {}) {
  return request.post("/api/auth/login", { data: { email, password }, headers });
}

async function temporaryUser(label: string) {
  const email = `${label}-${Date.now()}@example.test`;
  const user = await insertUser(db, { email, displayName: label, passwordHash: await hashPassword("long enough password"), role: "engineer" });
  return { user, email, password: "long enough password" };
}

test("login answers 400 with zod paths for malformed input", async ({ request }) => {
  const notJson = await request.post("/api/auth/login", { data: "{oops", headers: { "content-type": "application/json" } });
  expect(notJson.status()).toBe(400);
  const fields = await request.post("/api/auth/login", { data: { email: "not-an-email", password: "" } });
  expect(fields.status()).toBe(400);
  const body = await fields.json();
  expect(body.error.details.map((d: { path: string }) => d.path).sort()).toEqual(["email", "password"]);
});

test("me returns who is signed in", async ({ request }) => {
  expect((await login(request, "lead@tapwright.test", "tapwright-demo")).status()).toBe(200);
  expect(await (await request.get("/api/auth/me")).json()).toEqual({ email: "lead@tapwright.test", name: "Demo Lead", role: "lead" });
  const channels = await (await request.get("/api/v1/channels")).json();
  expect(channels).toContainEqual({ path: "hydraulic-press/press-ctl/ram-position", name: "Ram position", unit: "mm", sampleRateHz: 2000 });
  expect((await request.post("/api/auth/logout")).status()).toBe(200);
  expect((await request.get("/api/auth/me")).status()).toBe(401);
});

test("repeated failures for an account are throttled with 429", async ({ request }) => {
  const { email, password } = await temporaryUser("throttled");
  for (let i = 0; i < 5; i++) expect((await login(request, email, "wrong password")).status()).toBe(401);
  const refused = await login(request, email, password);
  expect(refused.status()).toBe(429);
});

test("repeated failures from one address are throttled with 429", async ({ request }) => {
  const headers = { "x-forwarded-for": `10.77.${Date.now() % 250}.9` };
  for (let i = 0; i < 20; i++) await login(request, `nobody-${i}@example.test`, "wrong password", headers);
  expect((await login(request, "engineer@tapwright.test", "tapwright-demo", headers)).status()).toBe(429);
  expect((await login(request, "engineer@tapwright.test", "tapwright-demo")).status()).toBe(200);
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

test("health says 503 in plain words when the database is down", async ({ request }) => {
  expect(await (await request.get("/api/health")).json()).toEqual({ status: "ok", db: "up" });
  const port = 3190;
  const server = spawn("node_modules/.bin/next", ["start", "-H", "127.0.0.1", "-p", String(port)], {
    env: { ...process.env, DATABASE_URL: "postgres://postgres@127.0.0.1:1/none" },
    stdio: "ignore",
  });
  try {
    let res;
    for (let i = 0; i < 60; i++) {
      res = await request.get(`http://127.0.0.1:${port}/api/health`).catch(() => undefined);
      if (res) break;
      await new Promise((r) => setTimeout(r, 250));
    }
    expect(res?.status()).toBe(503);
    expect(await res?.text()).toMatch(/^Database unavailable/);
    const login = await request.post(`http://127.0.0.1:${port}/api/auth/login`, { data: { email: "a@b.test", password: "x" } });
    expect(login.status()).toBe(503);
    expect((await login.json()).error.message).toMatch(/database/i);
  } finally {
    server.kill("SIGTERM");
  }
});
