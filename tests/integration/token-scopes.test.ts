import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { createToken, listTokens } from "@/db/queries/tokens";
import type { SessionUser } from "@/lib/auth/guard";
import { TOKEN_RATE, type TokenScope } from "@/lib/auth/token-scope";
import { actAs, butterSpec, jsonRequest, params, setUpLab, type Accounts } from "./sets-fixture";

vi.mock("@/db", async () => (await import("./sets-fixture")).dbModule);
vi.mock("@/app/_lib/auth", async () => (await import("./sets-fixture")).authModule);

const setsRoute = await import("@/app/api/v1/sets/route");
const transitions = await import("@/app/api/v1/revisions/[id]/transitions/route");
const promoteRoute = await import("@/app/api/v1/revisions/[id]/promote/route");
const exportRoute = await import("@/app/api/v1/revisions/[id]/export/route");
const channelsRoute = await import("@/app/api/v1/channels/route");

/** Channels of a 1 kHz rate: the promotions here each go to their own, so none waits on another's pending deployment. */
const CHANNELS = ["gearbox-endurance/torque-node/input-torque", "hydraulic-press/env-node/frame-strain"];
let lab: Awaited<ReturnType<typeof setUpLab>>;
let users: Accounts;
let approved: number;

beforeAll(async () => {
  lab = await setUpLab("token_scopes");
  users = lab.users;
  actAs(users.engineer);
  const created = await setsRoute.POST(jsonRequest("POST", "/api/v1/sets", { channel: CHANNELS[0], name: "Release LP", spec: butterSpec() }), undefined as never);
  approved = (await created.json()).revisionId;
  for (const [user, action, expectedVersion] of [[users.engineer, "submit", 1], [users.lead, "approve", 2]] as const) {
    actAs(user);
    const res = await transitions.POST(jsonRequest("POST", `/api/v1/revisions/${approved}/transitions`, { action, expectedVersion }), params({ id: String(approved) }));
    expect(res.status).toBe(200);
  }
  actAs(null);
});
afterAll(() => lab.close());

const newToken = (user: SessionUser, name: string, scope: TokenScope) => lab.db.transaction().execute((trx) => createToken(trx, user, name, scope));

function withToken(method: string, path: string, token: string, body?: unknown): Request {
  return new Request(`http://test.local${path}`, {
    method,
    headers: { authorization: `Bearer ${token}`, ...(body ? { "content-type": "application/json" } : {}) },
    body: body ? JSON.stringify(body) : undefined,
  });
}

const promote = (token: string, channel: string) =>
  promoteRoute.POST(withToken("POST", `/api/v1/revisions/${approved}/promote`, token, { channels: [channel] }), params({ id: String(approved) }));

const tokenAudit = (tokenId: number) =>
  lab.db.selectFrom("audit_log").select(["action", "after", "actor_id"]).where("entity", "=", "api_token").where("entity_id", "=", String(tokenId)).orderBy("id").execute();

describe("token scopes", () => {
  it("a read token exports but cannot promote (403), and nothing is deployed", async () => {
    const { token, view } = await newToken(users.lead, "firmware build", "read");
    expect(view.scope).toBe("read");
    const exported = await exportRoute.GET(withToken("GET", `/api/v1/revisions/${approved}/export?format=cmsis-df1`, token), params({ id: String(approved) }));
    expect(exported.status).toBe(200);
    expect(await exported.text()).toContain("arm_biquad_cascade_df1_init_q15(");
    const refused = await promote(token, CHANNELS[0]);
    expect(refused.status).toBe(403);
    expect((await refused.json()).error.message).toBe("This token has the read scope; this request needs a promote token.");
    expect(await lab.db.selectFrom("deployments").select("id").execute()).toEqual([]);
    expect((await tokenAudit(view.id)).map((a) => a.action)).toEqual(["token.create"]); // read tokens are not audited per use
  });

  it("a lead's promote token promotes (202); every use is audited with the token's name, the promotion too", async () => {
    const { token, view } = await newToken(users.lead, "release pipeline", "promote");
    const res = await promote(token, CHANNELS[0]);
    expect(res.status).toBe(202);
    const { deployments } = await res.json();
    expect(deployments).toHaveLength(1);
    const exportPath = `/api/v1/revisions/${approved}/export`;
    expect((await exportRoute.GET(withToken("GET", `${exportPath}?format=json`, token), params({ id: String(approved) }))).status).toBe(200);
    const uses = (await tokenAudit(view.id)).filter((a) => a.action === "token.use");
    expect(uses.map((a) => a.after)).toEqual([
      { token: "release pipeline", scope: "promote", method: "POST", path: `/api/v1/revisions/${approved}/promote` },
      { token: "release pipeline", scope: "promote", method: "GET", path: exportPath },
    ]);
    expect(uses.every((a) => a.actor_id === users.lead.id)).toBe(true);
    const request = await lab.db.selectFrom("audit_log").select("after").where("action", "=", "deployment.request").where("entity_id", "=", String(deployments[0].id)).executeTakeFirstOrThrow();
    expect(request.after).toMatchObject({ revisionId: approved, viaToken: "release pipeline" });
    const [listed] = (await listTokens(lab.db, users.lead)).filter((t) => t.id === view.id);
    expect(listed.lastUsedAt).toBeInstanceOf(Date);
  });

  it("only leads create promote tokens; a promote token whose owner is no longer a lead is refused (403), and audited", async () => {
    await expect(newToken(users.engineer, "sneaky", "promote")).rejects.toMatchObject({ code: "forbidden" });
    const { token, view } = await newToken(users.lead2, "second release", "promote");
    await lab.db.updateTable("users").set({ role: "engineer" }).where("id", "=", users.lead2.id).execute();
    const res = await promote(token, CHANNELS[1]);
    expect(res.status).toBe(403);
    expect((await res.json()).error.message).toMatch(/lead role/);
    expect((await tokenAudit(view.id)).map((a) => a.action)).toEqual(["token.create", "token.use"]);
    await lab.db.updateTable("users").set({ role: "lead" }).where("id", "=", users.lead2.id).execute();
  });

  it("a token stops when its owner is disabled and does not come back when the owner is re-enabled", async () => {
    const { token, view } = await newToken(users.engineer, "nightly export", "read");
    const list = () => channelsRoute.GET(withToken("GET", "/api/v1/channels", token), undefined as never);
    expect((await list()).status).toBe(200);
    await lab.db.updateTable("users").set({ disabled: true }).where("id", "=", users.engineer.id).execute();
    expect((await list()).status).toBe(401);
    await lab.db.updateTable("users").set({ disabled: false }).where("id", "=", users.engineer.id).execute();
    expect((await list()).status).toBe(401);
    const [listed] = (await listTokens(lab.db, users.engineer)).filter((t) => t.id === view.id);
    expect(listed).toMatchObject({ revokedReason: "owner_disabled" });
    expect(listed.revokedAt).toBeInstanceOf(Date);
  });

  it(`rate-limits each token: request ${TOKEN_RATE.maxPerWindow + 1} within a minute is a 429, other tokens are untouched`, async () => {
    const { token } = await newToken(users.lead, "chatty script", "read");
    const other = await newToken(users.lead, "quiet script", "read");
    const list = (t: string) => channelsRoute.GET(withToken("GET", "/api/v1/channels", t), undefined as never);
    for (let i = 0; i < TOKEN_RATE.maxPerWindow; i++) expect((await list(token)).status).toBe(200);
    const limited = await list(token);
    expect(limited.status).toBe(429);
    expect((await limited.json()).error.code).toBe("too_many_requests");
    expect((await list(other.token)).status).toBe(200);
    // The window restarts a minute after it began (moved back here instead of waiting).
    await lab.db.updateTable("api_tokens").set({ window_start: new Date(Date.now() - TOKEN_RATE.windowMs - 1000) }).where("name", "=", "chatty script").execute();
    expect((await list(token)).status).toBe(200);
  });

  it("a session still works without a token; a malformed or unknown token is 401 even with a session", async () => {
    actAs(users.operator);
    expect((await channelsRoute.GET(new Request("http://test.local/api/v1/channels"), undefined as never)).status).toBe(200);
    expect((await channelsRoute.GET(withToken("GET", "/api/v1/channels", "tw_unknown"), undefined as never)).status).toBe(401);
    actAs(null);
  });
});
