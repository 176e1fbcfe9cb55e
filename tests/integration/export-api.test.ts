import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { createToken, revokeToken, listTokens } from "@/db/queries/tokens";
import { channelConfigChecksum, channelConfigEntry } from "@/lib/coefficients";
import type { SessionUser } from "@/lib/auth/guard";
import { actAs, butterSpec, jsonRequest, params, pathParams, setUpLab, type Accounts } from "./sets-fixture";

vi.mock("@/db", async () => (await import("./sets-fixture")).dbModule);
vi.mock("@/app/_lib/auth", async () => (await import("./sets-fixture")).authModule);

const setsRoute = await import("@/app/api/v1/sets/route");
const exportRoute = await import("@/app/api/v1/revisions/[id]/export/route");
const productionExport = await import("@/app/api/v1/channels/[rig]/[device]/[channel]/production/export/route");

let lab: Awaited<ReturnType<typeof setUpLab>>;
let users: Accounts;
const CHANNEL = "gearbox-endurance/torque-node/input-torque";
/** A pole pair at radius √1.0002 > 1, typed as coefficients: saved, but never exported for firmware. */
const unstableSpec = { kind: "coefficients", sos: [[1, 0, 0, 1, -1.9, 1.0002]], sampleRateHz: 1000 };

beforeAll(async () => {
  lab = await setUpLab("export_api");
  users = lab.users;
});
afterAll(() => lab.close());

async function createSet(name: string, spec: unknown = butterSpec()): Promise<{ setId: number; revisionId: number }> {
  actAs(users.engineer);
  const res = await setsRoute.POST(jsonRequest("POST", "/api/v1/sets", { channel: CHANNEL, name, spec }), undefined as never);
  expect(res.status).toBe(201);
  return res.json();
}

function exportRequest(revisionId: number, query: string, token?: string) {
  const headers: Record<string, string> = token ? { authorization: `Bearer ${token}` } : {};
  return exportRoute.GET(new Request(`http://test.local/api/v1/revisions/${revisionId}/export?${query}`, { headers }), params({ id: String(revisionId) }));
}

const newToken = (user: SessionUser, name: string) => lab.db.transaction().execute((trx) => createToken(trx, user, name, "read"));

describe("export with API tokens", () => {
  it("exports a q15 header with a Bearer token and no session, recording the use and the audit entry", async () => {
    const { revisionId } = await createSet("Torque LP export");
    const { token, view } = await newToken(users.engineer, "CI firmware build");
    expect(token).toMatch(/^tw_[A-Za-z0-9_-]{43}$/);
    const stored = await lab.db.selectFrom("api_tokens").selectAll().where("id", "=", view.id).executeTakeFirstOrThrow();
    expect(stored.token_hash).toMatch(/^[0-9a-f]{64}$/);
    expect(JSON.stringify(stored)).not.toContain(token);
    actAs(null);
    const res = await exportRequest(revisionId, "format=c-header", token);
    expect(res.status).toBe(200);
    expect(res.headers.get("content-type")).toMatch(/^text\/x-c/);
    expect(res.headers.get("content-disposition")).toBe('attachment; filename="torque_lp_export_r1_q15.h"');
    const body = await res.text();
    expect(body).toContain("#define TORQUE_LP_EXPORT_R1_Q15_SECTIONS 1");
    expect(body).toContain(`Channel:      ${CHANNEL}`);
    const used = await lab.db.selectFrom("api_tokens").select("last_used_at").where("id", "=", view.id).executeTakeFirstOrThrow();
    expect(used.last_used_at).not.toBeNull();
    const audit = await lab.db.selectFrom("audit_log").select("action").where("entity", "=", "api_token").where("entity_id", "=", String(view.id)).execute();
    expect(audit.map((a) => a.action)).toEqual(["token.create"]);
  });

  it("serves json and scipy for other targets with their content types", async () => {
    const { revisionId } = await createSet("Torque LP formats");
    actAs(users.operator);
    const json = await exportRequest(revisionId, "format=json&target=q31");
    expect(json.status).toBe(200);
    expect(json.headers.get("content-type")).toMatch(/^application\/json/);
    expect((await json.json()).coefficients.format).toBe("q31");
    const py = await exportRequest(revisionId, "format=scipy&target=f32");
    expect(py.headers.get("content-type")).toMatch(/^text\/x-python/);
    expect(await py.text()).toContain("sos = [");
    expect((await exportRequest(revisionId, "format=pdf")).status).toBe(400);
    actAs(null);
    expect((await exportRequest(revisionId, "format=json")).status).toBe(401);
  });

  it("serves the CMSIS-DSP layouts and CSV; a target the format does not take is a 400 naming it", async () => {
    const { revisionId } = await createSet("Torque LP cmsis");
    actAs(users.operator);
    const df1 = await exportRequest(revisionId, "format=cmsis-df1");
    expect(df1.status).toBe(200);
    expect(df1.headers.get("content-disposition")).toBe('attachment; filename="torque_lp_cmsis_r1_q15_cmsis_df1.h"');
    expect(await df1.text()).toContain("static const q15_t torque_lp_cmsis_r1_q15_i0_coeffs[6 * TORQUE_LP_CMSIS_R1_Q15_I0_NUM_STAGES]");
    const df2t = await exportRequest(revisionId, "format=cmsis-df2t");
    expect(df2t.headers.get("content-disposition")).toBe('attachment; filename="torque_lp_cmsis_r1_f32_cmsis_df2t.h"');
    const bad = await exportRequest(revisionId, "format=cmsis-df2t&target=q31");
    expect(bad.status).toBe(400);
    expect((await bad.json()).error.details).toEqual([{ path: "target", message: "format cmsis-df2t takes target f32 (got q31)" }]);
    const csv = await exportRequest(revisionId, "format=csv&target=q31");
    expect(csv.headers.get("content-type")).toMatch(/^text\/csv/);
    expect((await csv.text()).split("\r\n")[0]).toBe("stage,spec_stage,kind,section,coefficient,value,word,shift");
  });

  it("answers 401 to a revoked token, a disabled owner's token and a malformed header", async () => {
    const { revisionId } = await createSet("Torque LP revoked");
    const revoked = await newToken(users.engineer, "old pipeline");
    await lab.db.transaction().execute((trx) => revokeToken(trx, users.engineer, revoked.view.id));
    actAs(users.engineer); // a valid session does not rescue a bad token
    expect((await exportRequest(revisionId, "format=json", revoked.token)).status).toBe(401);

    const [row] = await lab.db
      .insertInto("users")
      .values({ email: "leaver@tapwright.test", display_name: "Leaver", password_hash: "x", role: "engineer" })
      .returning(["id", "email", "display_name", "role"])
      .execute();
    const leaver = { id: row.id, email: row.email, name: row.display_name, role: row.role };
    const theirs = await newToken(leaver, "leaver pipeline");
    actAs(null);
    expect((await exportRequest(revisionId, "format=json", theirs.token)).status).toBe(200);
    await lab.db.updateTable("users").set({ disabled: true }).where("id", "=", leaver.id).execute();
    expect((await exportRequest(revisionId, "format=json", theirs.token)).status).toBe(401);
    expect((await exportRequest(revisionId, "format=json", "tw_not-a-token")).status).toBe(401);
    const audit = await lab.db.selectFrom("audit_log").select("action").where("entity_id", "=", String(revoked.view.id)).where("entity", "=", "api_token").execute();
    expect(audit.map((a) => a.action).sort()).toEqual(["token.create", "token.revoke"]);
  });

  it("lets engineers see and revoke only their own tokens; leads see all; operators cannot create", async () => {
    const mine = await newToken(users.engineer, "mine");
    const leads = await newToken(users.lead, "lead's");
    expect((await listTokens(lab.db, users.engineer)).map((t) => t.id)).toContain(mine.view.id);
    expect((await listTokens(lab.db, users.engineer)).map((t) => t.id)).not.toContain(leads.view.id);
    expect((await listTokens(lab.db, users.lead)).map((t) => t.id)).toEqual(expect.arrayContaining([mine.view.id, leads.view.id]));
    await expect(lab.db.transaction().execute((trx) => revokeToken(trx, users.engineer, leads.view.id))).rejects.toMatchObject({ code: "not_found" });
    await lab.db.transaction().execute((trx) => revokeToken(trx, users.lead, mine.view.id));
    await expect(lab.db.transaction().execute((trx) => revokeToken(trx, users.lead, mine.view.id))).rejects.toMatchObject({ code: "conflict" });
    await expect(newToken(users.operator, "nope")).rejects.toMatchObject({ code: "forbidden" });
  });
});

describe("refusals and production", () => {
  it("refuses firmware formats for an unstable revision with 422 and the reason, but gives scipy arrays", async () => {
    const { revisionId } = await createSet("Unstable typed", unstableSpec);
    actAs(users.engineer);
    const res = await exportRequest(revisionId, "format=c-header");
    expect(res.status).toBe(422);
    expect((await res.json()).error.message).toMatch(/not exported for firmware .*unstable/);
    expect((await exportRequest(revisionId, "format=json&target=f32")).status).toBe(422);
    expect((await exportRequest(revisionId, "format=scipy")).status).toBe(200);
  });

  it("production export: 404 with a plain message when nothing is active, the deployed revision otherwise", async () => {
    actAs(users.operator);
    const get = (query = "format=c-header") =>
      productionExport.GET(new Request(`http://test.local/api/v1/channels/${CHANNEL}/production/export?${query}`), params(pathParams(CHANNEL)));
    const none = await get();
    expect(none.status).toBe(404);
    expect((await none.json()).error.message).toBe(`Nothing is in production on ${CHANNEL}: no deployment is active.`);

    const { revisionId } = await createSet("Torque LP production");
    const rev = await lab.db.selectFrom("revisions").select(["design", "quantized"]).where("id", "=", revisionId).executeTakeFirstOrThrow();
    const channel = await lab.db.selectFrom("channels").select("id").where("key", "=", "input-torque").executeTakeFirstOrThrow();
    const config = channelConfigEntry(String(revisionId), { sampleRateHz: 1000 }, rev.quantized as never);
    const checksum = await channelConfigChecksum(config);
    const [dep] = await lab.db
      .insertInto("deployments")
      .values({ revision_id: revisionId, channel_id: channel.id, kind: "promote", state: "active", format: "q15", config: JSON.stringify(config), checksum, previous_id: null, requested_by: users.lead.id })
      .returning("id")
      .execute();
    const res = await get("format=json");
    expect(res.status).toBe(200);
    const doc = await res.json();
    expect(doc).toMatchObject({ revision: { id: revisionId }, target: "q15", deployment: { id: dep.id, checksum } });
    expect(doc.coefficients.stages).toEqual(config.stages);
    expect((await get("format=c-header")).headers.get("content-disposition")).toBe('attachment; filename="torque_lp_production_r1_q15.h"');
  });
});
