import { Ajv2020 } from "ajv/dist/2020.js";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { createToken } from "@/db/queries/tokens";
import { channelConfigChecksum, channelConfigEntry } from "@/lib/coefficients";
import type { SessionUser } from "@/lib/auth/guard";
import { actAs, butterSpec, jsonRequest, params, pathParams, setUpLab, type Accounts } from "./sets-fixture";

vi.mock("@/db", async () => (await import("./sets-fixture")).dbModule);
vi.mock("@/app/_lib/auth", async () => (await import("./sets-fixture")).authModule);
vi.mock("@/lib/auth/session", () => ({
  getSession: async () => ({ userId: undefined, sessionVersion: undefined, save: async () => undefined, destroy: () => undefined }),
  // No sign-in cookie of an earlier success on this client.
  knownDevice: async () => null,
  rememberDevice: async () => undefined,
}));

const { apiDocument } = await import("@/app/api/v1/openapi.json/document");

/** A route module: its handlers by HTTP method (and, for some, `dynamic`). */
type RouteModule = { GET?: (req: Request, ctx: never) => Promise<Response>; POST?: (req: Request, ctx: never) => Promise<Response> };

/** Route modules by documented path. */
const ROUTES: Record<string, RouteModule> = {
  "/api/health": await import("@/app/api/health/route"),
  "/api/v1/openapi.json": await import("@/app/api/v1/openapi.json/route"),
  "/api/auth/login": await import("@/app/api/auth/login/route"),
  "/api/auth/logout": await import("@/app/api/auth/logout/route"),
  "/api/auth/me": await import("@/app/api/auth/me/route"),
  "/api/v1/channels": await import("@/app/api/v1/channels/route"),
  "/api/v1/channels/{rig}/{device}/{channel}/production": await import("@/app/api/v1/channels/[rig]/[device]/[channel]/production/route"),
  "/api/v1/channels/{rig}/{device}/{channel}/production/export": await import("@/app/api/v1/channels/[rig]/[device]/[channel]/production/export/route"),
  "/api/v1/sets": await import("@/app/api/v1/sets/route"),
  "/api/v1/sets/{id}": await import("@/app/api/v1/sets/[id]/route"),
  "/api/v1/sets/{id}/revisions": await import("@/app/api/v1/sets/[id]/revisions/route"),
  "/api/v1/sets/{id}/retire": await import("@/app/api/v1/sets/[id]/retire/route"),
  "/api/v1/revisions/{id}": await import("@/app/api/v1/revisions/[id]/route"),
  "/api/v1/revisions/{id}/transitions": await import("@/app/api/v1/revisions/[id]/transitions/route"),
  "/api/v1/revisions/{id}/promote": await import("@/app/api/v1/revisions/[id]/promote/route"),
  "/api/v1/revisions/{id}/export": await import("@/app/api/v1/revisions/[id]/export/route"),
  "/api/v1/deployments": await import("@/app/api/v1/deployments/route"),
  "/api/v1/deployments/{id}": await import("@/app/api/v1/deployments/[id]/route"),
  "/api/v1/deployments/rollback": await import("@/app/api/v1/deployments/rollback/route"),
  "/api/v1/audit": await import("@/app/api/v1/audit/route"),
};

const CHANNEL = "gearbox-endurance/torque-node/input-torque";
const OTHER = "hydraulic-press/env-node/frame-strain";
let lab: Awaited<ReturnType<typeof setUpLab>>;
let users: Accounts;
let token: string;
let ids: { setId: number; revisionId: number; approvedId: number; retireSetId: number; deploymentId: number };

async function json(res: Response) {
  return res.json();
}

/** Runs a handler as a user (null: no session). */
async function call(user: SessionUser | null, path: string, method: string, req: Request, ctx: unknown = undefined): Promise<Response> {
  actAs(user);
  const route = ROUTES[path][method === "get" ? "GET" : "POST"];
  if (!route) throw new Error(`no ${method} handler for ${path}`);
  return route(req, ctx as never);
}

beforeAll(async () => {
  lab = await setUpLab("openapi_calls");
  users = lab.users;
  token = (await lab.db.transaction().execute((trx) => createToken(trx, users.lead, "openapi check", "promote"))).token;
  const post = (user: SessionUser, path: string, url: string, body: unknown, ctx?: unknown) => call(user, path, "POST", jsonRequest("POST", url, body), ctx);
  const set = await json(await post(users.engineer, "/api/v1/sets", "/api/v1/sets", { channel: CHANNEL, name: "Doc LP", spec: butterSpec() }));
  const approved = await json(await post(users.engineer, "/api/v1/sets", "/api/v1/sets", { channel: CHANNEL, name: "Doc approved", spec: butterSpec(50) }));
  const retire = await json(await post(users.engineer, "/api/v1/sets", "/api/v1/sets", { channel: CHANNEL, name: "Doc retire", spec: butterSpec(80) }));
  for (const [user, action, expectedVersion] of [[users.engineer, "submit", 1], [users.lead, "approve", 2]] as const) {
    const url = `/api/v1/revisions/${approved.revisionId}/transitions`;
    expect((await post(user, "/api/v1/revisions/{id}/transitions", url, { action, expectedVersion }, params({ id: String(approved.revisionId) }))).status).toBe(200);
  }
  // An active deployment on CHANNEL, as the device's acknowledgement would leave it.
  const rev = await lab.db.selectFrom("revisions").select("quantized").where("id", "=", set.revisionId).executeTakeFirstOrThrow();
  const channel = await lab.db.selectFrom("channels").select("id").where("key", "=", "input-torque").executeTakeFirstOrThrow();
  const config = channelConfigEntry(String(set.revisionId), { sampleRateHz: 1000 }, rev.quantized as never);
  const [dep] = await lab.db
    .insertInto("deployments")
    .values({ revision_id: set.revisionId, channel_id: channel.id, kind: "promote", state: "active", format: "q15", config: JSON.stringify(config), checksum: await channelConfigChecksum(config), previous_id: null, requested_by: users.lead.id })
    .returning("id")
    .execute();
  ids = { setId: set.setId, revisionId: set.revisionId, approvedId: approved.revisionId, retireSetId: retire.setId, deploymentId: dep.id };
});
afterAll(() => lab.close());

const bearer = () => ({ authorization: `Bearer ${token}` });
const get = (url: string, headers: Record<string, string> = {}) => new Request(`http://test.local${url}`, { headers });

/** One call per documented operation: who calls, the request, the route context and the status expected. */
function calls(): Record<string, { user: SessionUser | null; req: Request; ctx?: unknown; status: number }> {
  const id = (n: number) => params({ id: String(n) });
  const production = `/api/v1/channels/${CHANNEL}/production`;
  return {
    "get /api/health": { user: null, req: get("/api/health"), status: 200 },
    "get /api/v1/openapi.json": { user: null, req: get("/api/v1/openapi.json"), status: 200 },
    "post /api/auth/login": { user: null, req: jsonRequest("POST", "/api/auth/login", { email: "operator@tapwright.test", password: "tapwright-demo" }), status: 200 },
    "post /api/auth/logout": { user: null, req: jsonRequest("POST", "/api/auth/logout"), status: 200 },
    "get /api/auth/me": { user: users.operator, req: get("/api/auth/me"), status: 200 },
    "get /api/v1/channels": { user: null, req: get("/api/v1/channels", bearer()), status: 200 },
    "get /api/v1/channels/{rig}/{device}/{channel}/production": { user: users.operator, req: get(production), ctx: params(pathParams(CHANNEL)), status: 200 },
    "get /api/v1/channels/{rig}/{device}/{channel}/production/export": {
      user: null,
      req: get(`${production}/export?format=cmsis-df1`, bearer()),
      ctx: params(pathParams(CHANNEL)),
      status: 200,
    },
    "get /api/v1/sets": { user: users.operator, req: get("/api/v1/sets?sort=name&pageSize=5"), status: 200 },
    "post /api/v1/sets": { user: users.engineer, req: jsonRequest("POST", "/api/v1/sets", { channel: CHANNEL, name: "Doc new", spec: butterSpec(120) }), status: 201 },
    "get /api/v1/sets/{id}": { user: null, req: get(`/api/v1/sets/${ids.setId}`, bearer()), ctx: id(ids.setId), status: 200 },
    "post /api/v1/sets/{id}/revisions": {
      user: users.engineer,
      req: jsonRequest("POST", `/api/v1/sets/${ids.setId}/revisions`, { spec: butterSpec(110), expectedLatestRevision: 1 }),
      ctx: id(ids.setId),
      status: 201,
    },
    "post /api/v1/sets/{id}/retire": { user: users.lead, req: jsonRequest("POST", `/api/v1/sets/${ids.retireSetId}/retire`, { expectedVersion: 1 }), ctx: id(ids.retireSetId), status: 200 },
    "get /api/v1/revisions/{id}": { user: users.operator, req: get(`/api/v1/revisions/${ids.revisionId}`), ctx: id(ids.revisionId), status: 200 },
    "post /api/v1/revisions/{id}/transitions": {
      user: users.engineer,
      req: jsonRequest("POST", `/api/v1/revisions/${ids.revisionId}/transitions`, { action: "submit", expectedVersion: 1 }),
      ctx: id(ids.revisionId),
      status: 200,
    },
    "post /api/v1/revisions/{id}/promote": {
      user: null,
      req: new Request(`http://test.local/api/v1/revisions/${ids.approvedId}/promote`, {
        method: "POST",
        headers: { ...bearer(), "content-type": "application/json" },
        body: JSON.stringify({ channels: [OTHER] }),
      }),
      ctx: id(ids.approvedId),
      status: 202,
    },
    "get /api/v1/revisions/{id}/export": { user: users.operator, req: get(`/api/v1/revisions/${ids.revisionId}/export?format=csv`), ctx: id(ids.revisionId), status: 200 },
    "post /api/v1/deployments/rollback": {
      user: users.lead,
      req: jsonRequest("POST", "/api/v1/deployments/rollback", { channel: CHANNEL, expectedActiveId: ids.deploymentId }),
      status: 202, // nothing ran before the active deployment: the channel returns to no filter
    },
    "get /api/v1/deployments": { user: users.operator, req: get(`/api/v1/deployments?channel=${CHANNEL}`), status: 200 },
    "get /api/v1/deployments/{id}": { user: users.operator, req: get(`/api/v1/deployments/${ids.deploymentId}`), ctx: id(ids.deploymentId), status: 200 },
    "get /api/v1/audit": { user: users.lead, req: get("/api/v1/audit?pageSize=10"), status: 200 },
  };
}

describe("every documented route answers as documented", () => {
  it("one call each: a documented status, and a body of the documented media type and schema", async () => {
    const doc = apiDocument();
    const ajv = new Ajv2020({ strict: false, validateFormats: false });
    ajv.addSchema(doc, "openapi.json");
    const pointer = (...parts: string[]) => parts.map((p) => p.replace(/~/g, "~0").replace(/\//g, "~1")).join("/");
    const table = calls();
    const documented = Object.entries(doc.paths).flatMap(([path, ops]) => Object.keys(ops).map((method) => `${method} ${path}`));
    expect(Object.keys(table).sort()).toEqual(documented.sort());
    for (const [key, c] of Object.entries(table)) {
      const [method, path] = key.split(" ");
      const res = await call(c.user, path, method, c.req, c.ctx);
      const answer = doc.paths[path][method === "get" ? "get" : "post"]?.responses[String(res.status)];
      expect({ key, status: res.status, documented: answer !== undefined }).toEqual({ key, status: c.status, documented: true });
      const type = (res.headers.get("content-type") ?? "").split(";")[0];
      const content = answer?.content ?? {};
      expect({ key, type, documentedTypes: Object.keys(content) }).toMatchObject({ key, documentedTypes: expect.arrayContaining([type]) });
      if (type !== "application/json") continue;
      const validate = ajv.getSchema(`openapi.json#/${pointer("paths", path, method, "responses", String(res.status), "content", "application/json", "schema")}`);
      const body = await res.json();
      expect({ key, valid: validate?.(body), errors: validate?.errors ?? null }).toEqual({ key, valid: true, errors: null });
    }
  });
});
