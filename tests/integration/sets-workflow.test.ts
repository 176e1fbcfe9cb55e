import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { readDesign } from "@/db/json-columns";
import type { SessionUser } from "@/lib/auth/guard";
import { actAs, butterSpec, jsonRequest, params, setUpLab, type Accounts } from "./sets-fixture";

vi.mock("@/db", async () => (await import("./sets-fixture")).dbModule);
vi.mock("@/app/_lib/auth", async () => (await import("./sets-fixture")).authModule);
vi.mock("next/cache", () => ({ revalidatePath: () => undefined }));

const setsRoute = await import("@/app/api/v1/sets/route");
const transitions = await import("@/app/api/v1/revisions/[id]/transitions/route");
const promoteRoute = await import("@/app/api/v1/revisions/[id]/promote/route");
const rollbackRoute = await import("@/app/api/v1/deployments/rollback/route");
const retireRoute = await import("@/app/api/v1/sets/[id]/retire/route");
const auditRoute = await import("@/app/api/v1/audit/route");
const actions = await import("@/app/(lab)/sets/[id]/actions");

const CHANNEL = "gearbox-endurance/torque-node/input-torque";
let lab: Awaited<ReturnType<typeof setUpLab>>;
let users: Accounts;

beforeAll(async () => {
  lab = await setUpLab("sets_workflow");
  users = lab.users;
});
afterAll(() => lab.close());

async function newRevision(author: SessionUser): Promise<{ setId: number; revisionId: number }> {
  actAs(author);
  const res = await setsRoute.POST(jsonRequest("POST", "/api/v1/sets", { channel: CHANNEL, name: `set ${Math.random()}`, spec: butterSpec() }), undefined as never);
  expect(res.status).toBe(201);
  return res.json();
}

async function transition(user: SessionUser, revisionId: number, action: string, expectedVersion: number, comment?: string) {
  actAs(user);
  const res = await transitions.POST(
    jsonRequest("POST", `/api/v1/revisions/${revisionId}/transitions`, { action, expectedVersion, comment }),
    params({ id: String(revisionId) }),
  );
  return { status: res.status, body: await res.json() };
}

function form(fields: Record<string, string | number | string[]>): FormData {
  const f = new FormData();
  for (const [k, v] of Object.entries(fields)) for (const item of [v].flat()) f.append(k, String(item));
  return f;
}

describe("role × transition over HTTP", () => {
  const roles = ["operator", "engineer", "lead", "admin"] as const;
  const expected = {
    submit: { operator: 403, engineer: 200, lead: 200, admin: 200 },
    approve: { operator: 403, engineer: 403, lead: 200, admin: 200 },
    reject: { operator: 403, engineer: 403, lead: 200, admin: 200 },
  } as const;

  for (const action of ["submit", "approve", "reject"] as const) {
    for (const role of roles) {
      it(`${role} → ${action}: ${expected[action][role]}`, async () => {
        const { revisionId } = await newRevision(users.engineer);
        if (action !== "submit") expect((await transition(users.engineer, revisionId, "submit", 1)).status).toBe(200);
        const version = action === "submit" ? 1 : 2;
        const { status } = await transition(users[role], revisionId, action, version, "looked at it");
        expect(status).toBe(expected[action][role]);
      });
    }
  }
});

describe("review rules over HTTP", () => {
  it("applies four eyes to a lead's own revision and lets another lead approve it", async () => {
    const { revisionId } = await newRevision(users.lead);
    expect((await transition(users.lead, revisionId, "submit", 1)).status).toBe(200);
    const own = await transition(users.lead, revisionId, "approve", 2);
    expect(own.status).toBe(403);
    expect(own.body.error.message).toMatch(/Four eyes/);
    expect((await transition(users.lead2, revisionId, "approve", 2)).status).toBe(200);
  });

  it("answers a stale form with 409 and never overwrites the newer decision", async () => {
    const { revisionId } = await newRevision(users.engineer);
    await transition(users.engineer, revisionId, "submit", 1);
    expect((await transition(users.lead, revisionId, "approve", 2)).status).toBe(200);
    const stale = await transition(users.lead2, revisionId, "reject", 2, "too much lag");
    expect(stale.status).toBe(409);
    const row = await lab.db.selectFrom("revisions").select(["state", "state_version"]).where("id", "=", revisionId).executeTakeFirstOrThrow();
    expect(row).toEqual({ state: "approved", state_version: 3 });
    const reviews = await lab.db.selectFrom("reviews").select("decision").where("revision_id", "=", revisionId).execute();
    expect(reviews).toEqual([{ decision: "approved" }]);
  });

  it("requires a comment to reject, and mails the author", async () => {
    const { revisionId } = await newRevision(users.engineer);
    await transition(users.engineer, revisionId, "submit", 1);
    expect((await transition(users.lead, revisionId, "reject", 2)).status).toBe(400);
    expect((await transition(users.lead, revisionId, "reject", 2, "Notch covers the gear-mesh tone.")).status).toBe(200);
    const mail = await lab.db.selectFrom("mail_outbox").select(["recipients", "body"]).where("kind", "=", "rejected").orderBy("id", "desc").executeTakeFirstOrThrow();
    expect(mail.recipients).toEqual(["engineer@tapwright.test"]);
    expect(mail.body).toContain("Notch covers the gear-mesh tone.");
    const requested = await lab.db.selectFrom("mail_outbox").select("recipients").where("kind", "=", "review_requested").executeTakeFirstOrThrow();
    expect(requested.recipients).toEqual(["lead2@tapwright.test", "lead@tapwright.test"]);
  });
});

describe("promotion, rollback and retirement by role over HTTP", () => {
  let approved: { setId: number; revisionId: number };
  beforeAll(async () => {
    approved = await newRevision(users.engineer);
    await transition(users.engineer, approved.revisionId, "submit", 1);
    await transition(users.lead, approved.revisionId, "approve", 2);
  });

  const promote = (user: SessionUser) => {
    actAs(user);
    return promoteRoute.POST(
      jsonRequest("POST", `/api/v1/revisions/${approved.revisionId}/promote`, { channels: [CHANNEL] }),
      params({ id: String(approved.revisionId) }),
    );
  };

  it("refuses operators and engineers the promotion (403) and accepts a lead (202)", async () => {
    expect((await promote(users.operator)).status).toBe(403);
    expect((await promote(users.engineer)).status).toBe(403);
    expect((await promote(users.lead)).status).toBe(202);
    expect((await promote(users.admin)).status).toBe(409); // one pending per channel
  });

  it("refuses engineers a rollback and answers a lead 409 when nothing ran before", async () => {
    actAs(users.engineer);
    const body = { channel: CHANNEL, expectedActiveId: 1 };
    expect((await rollbackRoute.POST(jsonRequest("POST", "/api/v1/deployments/rollback", body), undefined as never)).status).toBe(403);
    actAs(users.lead);
    expect((await rollbackRoute.POST(jsonRequest("POST", "/api/v1/deployments/rollback", body), undefined as never)).status).toBe(409);
  });

  it("lets only leads retire, then refuses new revisions and promotions on the retired set", async () => {
    const retire = (user: SessionUser, expectedVersion: number) => {
      actAs(user);
      return retireRoute.POST(jsonRequest("POST", `/api/v1/sets/${approved.setId}/retire`, { expectedVersion }), params({ id: String(approved.setId) }));
    };
    const version = (await lab.db.selectFrom("coefficient_sets").select("version").where("id", "=", approved.setId).executeTakeFirstOrThrow()).version;
    expect((await retire(users.engineer, version)).status).toBe(403);
    expect((await retire(users.lead, version - 1)).status).toBe(409);
    expect((await retire(users.lead, version)).status).toBe(200);
    await lab.db.updateTable("deployments").set({ state: "failed" }).where("state", "=", "pending").execute();
    expect((await promote(users.lead)).status).toBe(409);
  });
});

describe("server actions (a representative subset of the same rules)", () => {
  it("submits as an engineer, refuses an operator, and applies four eyes and stale versions", async () => {
    const { revisionId } = await newRevision(users.engineer);
    actAs(users.operator);
    const refused = await actions.transitionAction({ ok: true }, form({ revisionId, action: "submit", expectedVersion: 1 }));
    expect(refused).toMatchObject({ ok: false, message: expect.stringMatching(/engineer role/) });
    actAs(users.engineer);
    expect(await actions.transitionAction({ ok: true }, form({ revisionId, action: "submit", expectedVersion: 1 }))).toMatchObject({ ok: true });
    expect(await actions.transitionAction({ ok: true }, form({ revisionId, action: "approve", expectedVersion: 2 }))).toMatchObject({ ok: false });
    actAs(users.lead);
    expect(await actions.transitionAction({ ok: true }, form({ revisionId, action: "approve", expectedVersion: 1 }))).toMatchObject({
      ok: false,
      message: expect.stringMatching(/changed since you opened it/),
    });
    expect(await actions.transitionAction({ ok: true }, form({ revisionId, action: "approve", expectedVersion: 2 }))).toMatchObject({ ok: true });
  });

  it("refuses a promotion without the confirmation of the cautions, and an engineer's promotion", async () => {
    const { revisionId } = await newRevision(users.engineer);
    actAs(users.engineer);
    await actions.transitionAction({ ok: true }, form({ revisionId, action: "submit", expectedVersion: 1 }));
    actAs(users.lead);
    await actions.transitionAction({ ok: true }, form({ revisionId, action: "approve", expectedVersion: 2 }));
    expect(await actions.promoteAction({ ok: true }, form({ revisionId, channels: [CHANNEL] }))).toMatchObject({
      ok: false,
      fieldErrors: { confirm: expect.stringMatching(/cautions/) },
    });
    actAs(users.engineer);
    expect(await actions.promoteAction({ ok: true }, form({ revisionId, channels: [CHANNEL], confirm: "yes" }))).toMatchObject({ ok: false });
    actAs(users.lead);
    expect(await actions.promoteAction({ ok: true }, form({ revisionId, channels: [CHANNEL], confirm: "yes" }))).toMatchObject({ ok: true });
  });

  it("saves a new revision from JSON (a chain too), and refuses a stale one and a bad chain", async () => {
    const { setId } = await newRevision(users.engineer);
    const spec = JSON.stringify(butterSpec(60));
    expect(await actions.reviseAction({ ok: true }, form({ setId, expectedLatestRevision: 1, spec, notes: "lower" }))).toMatchObject({
      ok: true,
      message: "Saved revision r2 as a draft.",
    });
    expect(await actions.reviseAction({ ok: true }, form({ setId, expectedLatestRevision: 1, spec }))).toMatchObject({ ok: false });
    expect(await actions.reviseAction({ ok: true }, form({ setId, expectedLatestRevision: 2, spec: "{" }))).toMatchObject({ ok: false });
    const chain = { kind: "chain", sampleRateHz: 1000, stages: [{ kind: "biquad", shape: "notch", centerHz: 50, q: 5, sampleRateHz: 1000 }, butterSpec(60)] };
    expect(await actions.reviseAction({ ok: true }, form({ setId, expectedLatestRevision: 2, spec: JSON.stringify(chain) }))).toMatchObject({
      ok: true,
      message: "Saved revision r3 as a draft.",
    });
    const r3 = await lab.db.selectFrom("revisions").select(["id", "spec", "design"]).where("set_id", "=", setId).where("revision", "=", 3).executeTakeFirstOrThrow();
    expect(r3.spec).toEqual(chain);
    expect(readDesign(r3.design, { table: "revisions", id: r3.id }).stages).toHaveLength(2);
    const nested = JSON.stringify({ ...chain, stages: [chain] });
    expect(await actions.reviseAction({ ok: true }, form({ setId, expectedLatestRevision: 3, spec: nested }))).toMatchObject({
      ok: false,
      message: expect.stringMatching(/cannot hold another chain/),
    });
  });
});

describe("audit trail", () => {
  it("is for leads and exports RFC 4180 CSV", async () => {
    actAs(users.engineer);
    expect((await auditRoute.GET(jsonRequest("GET", "/api/v1/audit"), undefined as never)).status).toBe(403);
    actAs(users.lead);
    const page = await (await auditRoute.GET(jsonRequest("GET", "/api/v1/audit?entity=revision&action=revision.reject"), undefined as never)).json();
    expect(page.total).toBe(3); // two from the role matrix (lead, admin), one with the reason below
    expect(page.items[0]).toMatchObject({ actor: "Demo Lead", entity: "revision", after: { state: "rejected", comment: "Notch covers the gear-mesh tone." } });
    const res = await auditRoute.GET(jsonRequest("GET", "/api/v1/audit?format=csv&action=revision.reject"), undefined as never);
    expect(res.headers.get("content-type")).toMatch(/^text\/csv/);
    const csv = await res.text();
    const lines = csv.split("\r\n");
    expect(lines[0]).toBe("id,at_utc,actor,actor_email,action,entity,entity_id,before,after");
    expect(lines).toHaveLength(5); // header, three rows, empty after the final CRLF
    expect(lines[3]).toContain('"{""state"":""rejected"",""comment"":""Notch covers the gear-mesh tone."",""stateVersion"":3}"');
    expect(lines[1]).toContain(',"{""state"":""in_review"",""stateVersion"":2}",');
    const none = await (await auditRoute.GET(jsonRequest("GET", "/api/v1/audit?from=2000-01-01&to=2000-01-02"), undefined as never)).json();
    expect(none.total).toBe(0);
  });
});
