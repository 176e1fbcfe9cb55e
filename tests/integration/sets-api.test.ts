import { sql } from "kysely";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { readAnalysis, readDesign, readQuantized } from "@/db/json-columns";
import { actAs, butterSpec, jsonRequest, params, pathParams, setUpLab, type Accounts } from "./sets-fixture";

vi.mock("@/db", async () => (await import("./sets-fixture")).dbModule);
vi.mock("@/app/_lib/auth", async () => (await import("./sets-fixture")).authModule);

const setsRoute = await import("@/app/api/v1/sets/route");
const revisionsRoute = await import("@/app/api/v1/sets/[id]/revisions/route");
const productionRoute = await import("@/app/api/v1/channels/[rig]/[device]/[channel]/production/route");
const revisionRoute = await import("@/app/api/v1/revisions/[id]/route");

let lab: Awaited<ReturnType<typeof setUpLab>>;
let users: Accounts;
const CHANNEL = "gearbox-endurance/torque-node/input-torque";

beforeAll(async () => {
  lab = await setUpLab("sets_api");
  users = lab.users;
});
afterAll(() => lab.close());

async function createSet(name: string, spec: unknown = butterSpec()) {
  return setsRoute.POST(jsonRequest("POST", "/api/v1/sets", { channel: CHANNEL, name, spec }), undefined as never);
}

describe("POST /api/v1/sets", () => {
  it("creates a set with its first revision, designed and quantized on the server", async () => {
    actAs(users.engineer);
    const res = await createSet("Torque LP");
    expect(res.status).toBe(201);
    const body = await res.json();
    expect(body).toMatchObject({ revision: 1 });
    const rev = await lab.db.selectFrom("revisions").selectAll().where("id", "=", body.revisionId).executeTakeFirstOrThrow();
    expect(rev.device_format).toBe("q15");
    expect(rev.state).toBe("draft");
    const analysis = readAnalysis(rev.analysis, { table: "revisions", id: rev.id });
    expect(analysis.stable).toBe(true);
    expect(analysis.cutoffsHz[0]).toBeCloseTo(100, 6); // a Butterworth is −3.0103 dB at fc: |H(jωc)|² = 1/2 (Butterworth 1930), kept by the prewarped bilinear map
    expect(analysis.deployable.ok).toBe(true);
    const audit = await lab.db.selectFrom("audit_log").select("action").where("entity_id", "=", String(body.setId)).execute();
    expect(audit.map((a) => a.action)).toContain("set.create");
  });

  it("refuses operators (403), a spec at another sample rate (422) and an unknown channel (404)", async () => {
    actAs(users.operator);
    expect((await createSet("x")).status).toBe(403);
    actAs(users.engineer);
    expect((await createSet("x", butterSpec(100, 2000))).status).toBe(422);
    const res = await setsRoute.POST(jsonRequest("POST", "/api/v1/sets", { channel: "no/such/channel", name: "x", spec: butterSpec() }), undefined as never);
    expect(res.status).toBe(404);
    actAs(null);
    expect((await createSet("x")).status).toBe(401);
  });
});

describe("POST /api/v1/sets/{id}/revisions", () => {
  it("adds revision 2, and answers 409 to a save from a stale revision", async () => {
    actAs(users.engineer);
    const { setId } = await (await createSet("Torque LP two")).json();
    const save = (expected: number, fc: number) =>
      revisionsRoute.POST(
        jsonRequest("POST", `/api/v1/sets/${setId}/revisions`, { spec: butterSpec(fc), notes: "narrower", expectedLatestRevision: expected }),
        params({ id: String(setId) }),
      );
    const second = await save(1, 80);
    expect(second.status).toBe(201);
    expect(await second.json()).toMatchObject({ setId, revision: 2 });
    const stale = await save(1, 70);
    expect(stale.status).toBe(409);
    expect((await stale.json()).error.code).toBe("conflict");
  });

  it("keeps revision content immutable in the database", async () => {
    const rev = await lab.db.selectFrom("revisions").select("id").executeTakeFirstOrThrow();
    await expect(sql`update revisions set notes = 'edited' where id = ${rev.id}`.execute(lab.db)).rejects.toThrow(/immutable/);
    await expect(sql`update revisions set spec = '{}'::jsonb where id = ${rev.id}`.execute(lab.db)).rejects.toThrow(/immutable/);
    await expect(sql`delete from revisions where id = ${rev.id}`.execute(lab.db)).rejects.toThrow(/immutable/);
  });
});

describe("GET /api/v1/sets", () => {
  it("pages, filters and sorts on the server", async () => {
    actAs(users.operator);
    const get = async (qs: string) => (await setsRoute.GET(jsonRequest("GET", `/api/v1/sets?${qs}`), undefined as never)).json();
    const all = await get("sort=name&dir=asc&pageSize=1");
    expect(all.total).toBe(2);
    expect(all.items).toHaveLength(1);
    expect(all.items[0]).toMatchObject({ name: "Torque LP", channel: CHANNEL, status: "draft", latestRevision: 1, author: "Demo Engineer" });
    const page2 = await get("sort=name&dir=asc&pageSize=1&page=2");
    expect(page2.items[0].name).toBe("Torque LP two");
    expect((await get("q=two")).total).toBe(1);
    expect((await get("status=approved")).total).toBe(0);
    expect((await get("author=engineer")).total).toBe(2);
    expect((await get(`channel=${CHANNEL}`)).total).toBe(2);
    const bad = await setsRoute.GET(jsonRequest("GET", "/api/v1/sets?sort=bogus"), undefined as never);
    expect(bad.status).toBe(400);
  });
});

describe("GET /api/v1/channels/{path}/production", () => {
  it("answers 404 while nothing is active", async () => {
    actAs(users.operator);
    const res = await productionRoute.GET(jsonRequest("GET", `/api/v1/channels/${CHANNEL}/production`), params(pathParams(CHANNEL)));
    expect(res.status).toBe(404);
  });
});

describe("chains through the sets API", () => {
  const notch = (centerHz: number, sampleRateHz = 1000) => ({ kind: "biquad", shape: "notch", centerHz, q: 5, sampleRateHz });
  const chain = { kind: "chain", sampleRateHz: 1000, stages: [notch(50), notch(150), butterSpec(200)] };

  it("saves a chain as revision 1 and another as revision 2; the revision holds every stage", async () => {
    actAs(users.engineer);
    const res = await createSet("Torque hum chain", chain);
    expect(res.status).toBe(201);
    const { setId, revisionId } = await res.json();
    const rev = await lab.db.selectFrom("revisions").select(["spec", "design", "quantized"]).where("id", "=", revisionId).executeTakeFirstOrThrow();
    expect(rev.spec).toEqual(chain);
    expect(readDesign(rev.design, { table: "revisions", id: revisionId }).stages).toHaveLength(3);
    expect(readQuantized(rev.quantized, { table: "revisions", id: revisionId })?.stages?.map((s) => s.stage)).toEqual([0, 1, 2]);
    const next = { ...chain, stages: [{ ...notch(50), bypassed: true }, notch(150), butterSpec(150)] };
    const second = await revisionsRoute.POST(
      jsonRequest("POST", `/api/v1/sets/${setId}/revisions`, { spec: next, expectedLatestRevision: 1 }),
      params({ id: String(setId) }),
    );
    expect(second.status).toBe(201);
    const { revisionId: r2 } = await second.json();
    const stored = await lab.db.selectFrom("revisions").select("quantized").where("id", "=", r2).executeTakeFirstOrThrow();
    expect(readQuantized(stored.quantized, { table: "revisions", id: r2 })?.stages?.map((s) => s.stage)).toEqual([1, 2]); // the bypassed stage is kept in the spec, not run
  });

  it("refuses a bad chain with 400 and the stage's path: 9 stages, a nested chain, a stage at another rate, no stages", async () => {
    actAs(users.engineer);
    const refusal = async (spec: unknown) => {
      const res = await createSet("bad chain", spec);
      expect(res.status).toBe(400);
      return (await res.json()).error.details[0];
    };
    expect(await refusal({ ...chain, stages: new Array(9).fill(notch(50)) })).toEqual({ path: "spec.stages", message: "a chain holds at most 8 stages (got 9)" });
    expect((await refusal({ ...chain, stages: [chain] })).message).toMatch(/cannot hold another chain/);
    expect(await refusal({ ...chain, stages: [notch(50), notch(50, 2000)] })).toEqual({
      path: "spec.stages.1.sampleRateHz",
      message: "stage 2 is designed for 2000 Hz but the chain runs at 1000 Hz; every stage must use the chain's sample rate",
    });
    expect(await refusal({ ...chain, stages: [] })).toEqual({ path: "spec.stages", message: "a chain needs at least 1 stage (got 0)" });
    expect((await createSet("chain at 2 kHz", { ...chain, sampleRateHz: 2000, stages: [notch(50, 2000)] })).status).toBe(422);
  });
});

describe("a stored revision that no longer parses", () => {
  it("is refused with 500 and a safe body, and the log names the table, the row and the column", async () => {
    actAs(users.engineer);
    const { revisionId } = await (await createSet("Torque LP stale row")).json();
    const bad = await lab.db
      .insertInto("revisions")
      .columns(["set_id", "revision", "spec", "design", "device_format", "quantized", "analysis", "sample_rate_hz", "author_id"])
      .expression((eb) =>
        eb
          .selectFrom("revisions")
          .select([
            "set_id",
            sql<number>`2`.as("revision"),
            sql<string>`'{"kind":"iir","family":"butterworth"}'::jsonb`.as("spec"),
            "design",
            "device_format",
            "quantized",
            "analysis",
            "sample_rate_hz",
            "author_id",
          ])
          .where("id", "=", revisionId),
      )
      .returning("id")
      .executeTakeFirstOrThrow();
    const log = vi.spyOn(console, "error").mockImplementation(() => undefined);
    try {
      actAs(users.operator);
      const res = await revisionRoute.GET(new Request(`http://test.local/api/v1/revisions/${bad.id}`), params({ id: String(bad.id) }));
      expect(res.status).toBe(500);
      expect(await res.json()).toEqual({ error: { code: "internal", message: "Something went wrong on the server." } });
      expect(log.mock.calls.map((c) => c.join(" ")).join("\n")).toContain(`revisions row ${bad.id}: the stored spec no longer parses`);
      expect((await revisionRoute.GET(new Request(`http://test.local/api/v1/revisions/${revisionId}`), params({ id: String(revisionId) }))).status).toBe(200);
    } finally {
      log.mockRestore();
    }
  });
});
