import { readdirSync, readFileSync } from "node:fs";
import path from "node:path";
import { fileURLToPath } from "node:url";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { seedDemo } from "@/db/seed";
import { revokeSession } from "@/db/queries/sessions";
import { createToken } from "@/db/queries/tokens";
import { findUserByEmail } from "@/db/queries/users";
import { ROLES, roleAtLeast, type Role } from "@/lib/auth/roles";
import { SESSION_COOKIE } from "@/lib/auth/session-config";
import { appOrigin, env } from "@/lib/env";
import type { ActionState } from "@/lib/http/action-state";
import { freshDb } from "./support/fresh-db";
import { request, sessionCookie, state } from "./support/request-context";

/**
 * Every route handler (app/**\/route.ts) and every server action (app/**\/actions.ts), found on disk,
 * called as nobody, as each role and with each kind of credential, through the real session guard.
 * A route or action that is not declared below fails the test, and so does one whose guard does
 * not hold what is declared: a new route without a guard cannot slip in. Every state-changing route
 * and action is also called cross-site, and must refuse.
 */

// ---- What is declared: who may call what. -------------------------------------------------------

type Access = "public" | Role;
interface RoutePolicy {
  access: Access;
  /** The route also takes an API token (Authorization: Bearer; the matrix's token is an engineer's read token). */
  token?: true;
  /** A token needs this scope beyond read (a read token is refused with 403). */
  scope?: "promote";
  /** A query that gets the request past parsing to the guard. */
  query?: string;
}

const CHANNEL = "gearbox-endurance/torque-node/input-torque";
const ROUTES: Record<string, RoutePolicy> = {
  "POST /api/auth/login": { access: "public" },
  "POST /api/auth/logout": { access: "public" },
  "GET /api/auth/me": { access: "operator" },
  "GET /api/health": { access: "public" },
  "GET /api/v1/openapi.json": { access: "public" },
  "GET /api/v1/alarm-events": { access: "operator" },
  "POST /api/v1/alarm-events/[id]/acknowledge": { access: "operator" },
  "GET /api/v1/alarm-rules": { access: "operator" },
  "POST /api/v1/alarm-rules": { access: "engineer" },
  "PATCH /api/v1/alarm-rules/[id]": { access: "engineer" },
  "DELETE /api/v1/alarm-rules/[id]": { access: "engineer" },
  "GET /api/v1/annotations": { access: "operator" },
  "POST /api/v1/annotations": { access: "operator" },
  // Any role reaches the resource check (the author or a lead); an unknown id is 404 for all of them.
  "DELETE /api/v1/annotations/[id]": { access: "operator" },
  "GET /api/v1/audit": { access: "lead", token: true },
  "GET /api/v1/channels": { access: "operator", token: true },
  "PUT /api/v1/channels/[rig]/[device]/[channel]/candidates/[key]": { access: "engineer" },
  "DELETE /api/v1/channels/[rig]/[device]/[channel]/candidates/[key]": { access: "engineer" },
  "GET /api/v1/channels/[rig]/[device]/[channel]/production": { access: "operator", token: true },
  "GET /api/v1/channels/[rig]/[device]/[channel]/production/export": { access: "operator", token: true },
  "GET /api/v1/deployments": { access: "operator", query: `channel=${CHANNEL}`, token: true },
  "GET /api/v1/deployments/[id]": { access: "operator", token: true },
  "POST /api/v1/deployments/rollback": { access: "lead" },
  "GET /api/v1/live/overview": { access: "operator" },
  "GET /api/v1/live/owner": { access: "operator", query: `channel=${CHANNEL}` },
  "GET /api/v1/recordings": { access: "operator" },
  "POST /api/v1/recordings": { access: "engineer" },
  "GET /api/v1/recordings/[id]": { access: "operator" },
  // Any role reaches the resource check (the author or a lead); an unknown id is 404 for all of them.
  "DELETE /api/v1/recordings/[id]": { access: "operator" },
  "GET /api/v1/recordings/[id]/samples": { access: "operator" },
  "GET /api/v1/revisions/[id]": { access: "operator", token: true },
  "GET /api/v1/revisions/[id]/export": { access: "operator", token: true },
  "POST /api/v1/revisions/[id]/promote": { access: "lead", token: true, scope: "promote" },
  "POST /api/v1/revisions/[id]/transitions": { access: "engineer" },
  "GET /api/v1/sets": { access: "operator", token: true },
  "POST /api/v1/sets": { access: "engineer" },
  "GET /api/v1/sets/[id]": { access: "operator", token: true },
  "POST /api/v1/sets/[id]/retire": { access: "lead" },
  "POST /api/v1/sets/[id]/revisions": { access: "engineer" },
};

interface ActionPolicy {
  access: Role;
  /** Fields that pass the action's own parsing, so the call reaches the guard (ids that do not exist). */
  form: Record<string, string | string[]>;
}

const ACTIONS: Record<string, ActionPolicy> = {
  "admin/users#createUser": { access: "admin", form: { email: "matrix@example.test", displayName: "Matrix", role: "operator", password: "long enough password" } },
  "admin/users#changeUser": { access: "admin", form: { id: "999999", role: "operator" } },
  "sets/[id]#transitionAction": { access: "engineer", form: { revisionId: "999999", action: "submit", expectedVersion: "1" } },
  "sets/[id]#promoteAction": { access: "lead", form: { revisionId: "999999", channels: [CHANNEL], confirm: "yes" } },
  "sets/[id]#rollbackAction": { access: "lead", form: { channel: CHANNEL, expectedActiveId: "999999" } },
  "sets/[id]#retireAction": { access: "lead", form: { setId: "999999", expectedVersion: "1" } },
  "sets/[id]#reviseAction": {
    access: "engineer",
    form: { setId: "999999", expectedLatestRevision: "1", spec: JSON.stringify({ kind: "biquad", shape: "lowpass", centerHz: 50, q: 0.7, sampleRateHz: 1000 }) },
  },
  "tokens#createTokenAction": { access: "engineer", form: { name: "matrix" } },
  "tokens#revokeTokenAction": { access: "engineer", form: { tokenId: "999999" } },
};

// ---- The request context the real guard reads (next/headers), and the database. ---------------

vi.mock("server-only", () => ({}));
vi.mock("next/cache", () => ({ revalidatePath: () => undefined }));
vi.mock("next/headers", async () => (await import("./support/request-context")).nextHeaders);
vi.mock("@/db", async () => (await import("./support/request-context")).dbModule);
vi.mock("react", async (original) => ({ ...(await original<typeof import("react")>()), cache: <F>(fn: F) => fn }));

// ---- What is on disk. ---------------------------------------------------------------------------

const APP = path.resolve(path.dirname(fileURLToPath(import.meta.url)), "../../app");
const METHODS = ["GET", "HEAD", "POST", "PUT", "PATCH", "DELETE", "OPTIONS"] as const;

function filesNamed(dir: string, name: string): string[] {
  return readdirSync(dir, { withFileTypes: true }).flatMap((e) => {
    const full = path.join(dir, e.name);
    if (e.isDirectory()) return filesNamed(full, name);
    return e.name === name ? [full] : [];
  });
}

/** "/api/v1/sets/[id]" from ".../app/api/v1/sets/[id]/route.ts" (route groups dropped). */
const routePath = (file: string) =>
  "/" + path.relative(APP, path.dirname(file)).split(path.sep).filter((s) => !/^\(.*\)$/.test(s)).join("/");

/** The folder of an actions file, as in ACTIONS' keys ("sets/[id]"). */
const actionDir = (file: string) =>
  path.relative(APP, path.dirname(file)).split(path.sep).filter((s) => !/^\(.*\)$/.test(s)).join("/");

type Handler = (req: Request, ctx: { params: Promise<Record<string, string>> }) => Promise<Response>;

interface FoundRoute {
  key: string;
  method: string;
  path: string;
  handler: Handler;
}

const SAMPLE_PARAMS: Record<string, string> = { id: "999999", rig: "gearbox-endurance", device: "torque-node", channel: "input-torque", key: "cand-1" };

async function discoverRoutes(): Promise<FoundRoute[]> {
  const found: FoundRoute[] = [];
  for (const file of filesNamed(APP, "route.ts")) {
    const mod = (await import(file)) as Record<string, unknown>;
    for (const method of METHODS) {
      const handler = mod[method];
      if (typeof handler === "function") found.push({ key: `${method} ${routePath(file)}`, method, path: routePath(file), handler: handler as Handler });
    }
  }
  return found;
}

interface FoundAction {
  key: string;
  run: (prev: ActionState, form: FormData) => Promise<ActionState>;
}

async function discoverActions(): Promise<FoundAction[]> {
  const found: FoundAction[] = [];
  for (const file of filesNamed(APP, "actions.ts")) {
    expect(readFileSync(file, "utf8").trimStart().startsWith('"use server"'), `${file} must be a server actions module`).toBe(true);
    const mod = (await import(file)) as Record<string, unknown>;
    for (const [name, fn] of Object.entries(mod)) {
      if (typeof fn === "function") found.push({ key: `${actionDir(file)}#${name}`, run: fn as FoundAction["run"] });
    }
  }
  return found;
}

// ---- Credentials. -------------------------------------------------------------------------------

type Credential = "none" | "forged" | "revoked" | Role | "token";
/** Who owns the matrix's API token. */
const TOKEN_OWNER: Role = "engineer";
let token = "";
let revoked = "";

function sameOriginHeaders(): Record<string, string> {
  return { origin: appOrigin(env()), "content-type": "application/json" };
}

/** The session cookie a credential sends, if any: a role signs in afresh for every call (signing out revokes the session). */
async function presentCookie(credential: Credential): Promise<void> {
  request.cookies.clear();
  let cookie: string | undefined;
  if (credential === "forged") cookie = forged;
  else if (credential === "revoked") cookie = revoked;
  else if (credential !== "none" && credential !== "token") cookie = (await sessionCookie(state.db!, `${credential}@tapwright.test`, env().SESSION_SECRET)).cookie;
  if (cookie) request.cookies.set(SESSION_COOKIE, cookie);
}

/** Sets the guard's view of the request (cookie and headers) and builds the Request itself. */
async function prepare(route: FoundRoute, credential: Credential, headers: Record<string, string>): Promise<Request> {
  await presentCookie(credential);
  const all: Record<string, string> = { ...headers };
  if (credential === "token") all.authorization = `Bearer ${token}`;
  request.headers = new Headers(all);
  const query = ROUTES[route.key]?.query;
  const url = `http://127.0.0.1:3000${route.path.replace(/\[(\w+)\]/g, (_, p: string) => SAMPLE_PARAMS[p])}${query ? `?${query}` : ""}`;
  const body = route.method === "GET" || route.method === "HEAD" ? undefined : "{}";
  return new Request(url, { method: route.method, headers: all, body });
}

async function call(route: FoundRoute, credential: Credential, headers = sameOriginHeaders()): Promise<Response> {
  const req = await prepare(route, credential, headers);
  const params = Object.fromEntries(Object.entries(SAMPLE_PARAMS).filter(([p]) => route.path.includes(`[${p}]`)));
  return route.handler(req, { params: Promise.resolve(params) });
}

function form(fields: Record<string, string | string[]>): FormData {
  const f = new FormData();
  for (const [k, v] of Object.entries(fields)) for (const one of [v].flat()) f.append(k, one);
  return f;
}

async function act(action: FoundAction, credential: Credential, headers: Record<string, string>): Promise<ActionState> {
  await presentCookie(credential);
  request.headers = new Headers(headers);
  return action.run({ ok: true }, form(ACTIONS[action.key].form));
}

// ---- Set-up. ------------------------------------------------------------------------------------

let fresh: Awaited<ReturnType<typeof freshDb>>;
let routes: FoundRoute[] = [];
let actions: FoundAction[] = [];
let forged = "";

beforeAll(async () => {
  fresh = await freshDb("route_matrix");
  state.db = fresh.db;
  await seedDemo(fresh.db, "matrix-password");
  const signedOut = await sessionCookie(fresh.db, "admin@tapwright.test", env().SESSION_SECRET);
  await revokeSession(fresh.db, signedOut.sessionId);
  revoked = signedOut.cookie;
  forged = (await sessionCookie(fresh.db, "admin@tapwright.test", "another-secret-of-at-least-32-characters!")).cookie;
  const engineer = (await findUserByEmail(fresh.db, "engineer@tapwright.test"))!;
  token = (await fresh.db.transaction().execute((trx) => createToken(trx, { id: engineer.id, email: engineer.email, name: engineer.display_name, role: TOKEN_OWNER }, "matrix", "read"))).token;
  routes = await discoverRoutes();
  actions = await discoverActions();
}, 120_000);

afterAll(() => fresh?.close());

// ---- The matrix. --------------------------------------------------------------------------------

const GUARD = new Set([401, 403]);

describe("route × role × credential", () => {
  it("finds every route on disk declared, and every declaration on disk", () => {
    expect(routes.length).toBeGreaterThan(20);
    expect(routes.map((r) => r.key).filter((k) => !(k in ROUTES)), "routes without a declared policy").toEqual([]);
    expect(Object.keys(ROUTES).filter((k) => !routes.some((r) => r.key === k)), "declared routes that no longer exist").toEqual([]);
  });

  it("holds each route to its declared role for every credential", async () => {
    const wrong: string[] = [];
    for (const route of routes) {
      const policy = ROUTES[route.key];
      if (!policy) continue;
      for (const credential of ["none", "forged", "revoked", ...ROLES, "token"] as Credential[]) {
        const status = (await call(route, credential)).status;
        // The matrix's token acts as its owner (an engineer) with the read scope, on routes that take tokens.
        const tokenRole = credential === "token" && policy.token === true ? TOKEN_OWNER : undefined;
        const role = ROLES.find((r) => r === credential) ?? tokenRole;
        const allowed =
          policy.access === "public" || (role !== undefined && roleAtLeast(role, policy.access) && !(tokenRole && policy.scope === "promote"));
        const expected = allowed ? "not 401/403" : role ? "403" : "401";
        const ok = allowed ? !GUARD.has(status) : status === (role ? 403 : 401);
        if (!ok) wrong.push(`${route.key} as ${credential}: ${status}, expected ${expected}`);
      }
    }
    expect(wrong).toEqual([]);
  }, 120_000);

  it("refuses every state-changing route from another site, without an origin, or marked cross-site, before anything else", async () => {
    const wrong: string[] = [];
    const stateChanging = routes.filter((r) => !["GET", "HEAD", "OPTIONS"].includes(r.method));
    expect(stateChanging.length).toBeGreaterThan(8);
    for (const route of stateChanging) {
      const policy = ROUTES[route.key];
      const credential: Credential = policy?.access === "public" ? "none" : (policy?.access ?? "admin");
      const attempts: Record<string, Record<string, string>> = {
        "another origin": { origin: "http://127.0.0.1:4999", "content-type": "text/plain" },
        "another site": { origin: "https://elsewhere.example", "content-type": "text/plain" },
        "no origin at all": { "content-type": "text/plain" },
        "Sec-Fetch-Site: cross-site": { "sec-fetch-site": "cross-site", "content-type": "text/plain" },
        "Sec-Fetch-Site: same-site": { "sec-fetch-site": "same-site", "content-type": "text/plain" },
        "a foreign Referer": { referer: "https://elsewhere.example/page", "content-type": "text/plain" },
        "Origin: null": { origin: "null", "content-type": "text/plain" },
      };
      for (const [what, headers] of Object.entries(attempts)) {
        const res = await call(route, credential, headers);
        const body = (await res.json()) as { error?: { code: string; message: string } };
        if (res.status !== 403 || !/Cross-site request refused/.test(body.error?.message ?? "")) wrong.push(`${route.key} with ${what}: ${res.status}`);
      }
      for (const headers of [sameOriginHeaders(), { "sec-fetch-site": "same-origin" }, { referer: `${appOrigin(env())}/sets` }]) {
        const res = await call(route, credential, headers);
        const text = await res.text();
        if (/Cross-site request refused/.test(text)) wrong.push(`${route.key} refused its own page (${JSON.stringify(headers)})`);
      }
    }
    expect(wrong).toEqual([]);
  }, 120_000);
});

describe("server action × role × origin", () => {
  it("finds every action on disk declared, and every declaration on disk", () => {
    expect(actions.map((a) => a.key).filter((k) => !(k in ACTIONS)), "actions without a declared policy").toEqual([]);
    expect(Object.keys(ACTIONS).filter((k) => !actions.some((a) => a.key === k)), "declared actions that no longer exist").toEqual([]);
  });

  it("holds each action to its declared role", async () => {
    const wrong: string[] = [];
    const own = { origin: appOrigin(env()) };
    for (const action of actions) {
      const policy = ACTIONS[action.key];
      if (!policy) continue;
      for (const credential of ["none", "revoked", ...ROLES] as Credential[]) {
        const result = await act(action, credential, own);
        const role = ROLES.find((r) => r === credential);
        const allowed = role !== undefined && roleAtLeast(role, policy.access);
        const refusedAs = /Sign in to continue/.test(result.message ?? "") ? "401" : /needs the \w+ role/.test(result.message ?? "") ? "403" : null;
        const ok = allowed ? refusedAs === null : refusedAs === (role ? "403" : "401");
        if (!ok) wrong.push(`${action.key} as ${credential}: ${JSON.stringify(result)}`);
      }
    }
    expect(wrong).toEqual([]);
  }, 120_000);

  it("refuses every action without the app's own Origin, even when Sec-Fetch-Site says same-origin", async () => {
    const wrong: string[] = [];
    for (const action of actions) {
      const policy = ACTIONS[action.key];
      if (!policy) continue;
      const attempts: Array<Record<string, string>> = [{}, { origin: "https://elsewhere.example" }, { "sec-fetch-site": "same-origin" }, { origin: "null" }];
      for (const headers of attempts) {
        const result = await act(action, policy.access, headers);
        if (result.ok || !/Cross-site request refused/.test(result.message ?? "")) wrong.push(`${action.key} with ${JSON.stringify(headers)}: ${JSON.stringify(result)}`);
      }
    }
    expect(wrong).toEqual([]);
  }, 120_000);
});
