import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { decodeSamples, MAX_UPLOAD_BYTES } from "@/lib/recordings";
import { actAs, params, SAME_ORIGIN, setUpLab, type Accounts } from "./sets-fixture";

vi.mock("@/db", async () => (await import("./sets-fixture")).dbModule);
vi.mock("@/app/_lib/auth", async () => (await import("./sets-fixture")).authModule);

const listRoute = await import("@/app/api/v1/recordings/route");
const oneRoute = await import("@/app/api/v1/recordings/[id]/route");
const samplesRoute = await import("@/app/api/v1/recordings/[id]/samples/route");

let lab: Awaited<ReturnType<typeof setUpLab>>;
let users: Accounts;
const CHANNEL = "gearbox-endurance/torque-node/input-torque";

beforeAll(async () => {
  lab = await setUpLab("recordings_api");
  users = lab.users;
});
afterAll(() => lab.close());

/** Values that survive a decimal round trip exactly, with a missing sample at index 3. */
const VALUES = [0.125, -1.5, 3.25e-3, NaN, 42, 1e-9];

function csv(values: number[] = VALUES, fs = 1000): string {
  return ["t_s,torque[N·m]", ...values.map((v, i) => `${(i / fs).toFixed(4)},${Number.isNaN(v) ? "" : v}`)].join("\r\n");
}

function multipart(fields: Record<string, string>, text: string, fileName = "bench-run.csv"): Request {
  const form = new FormData();
  for (const [k, v] of Object.entries(fields)) form.set(k, v);
  form.set("file", new File([text], fileName, { type: "text/csv" }));
  return new Request("http://test.local/api/v1/recordings", { method: "POST", headers: SAME_ORIGIN, body: form });
}

function csvRequest(query: string, text: string): Request {
  return new Request(`http://test.local/api/v1/recordings?${query}`, { method: "POST", headers: { "content-type": "text/csv", ...SAME_ORIGIN }, body: text });
}

const upload = (req: Request) => listRoute.POST(req, undefined as never);
const list = (query = "") => listRoute.GET(new Request(`http://test.local/api/v1/recordings${query}`), undefined as never);
const samples = (id: number, query = "") => samplesRoute.GET(new Request(`http://test.local/api/v1/recordings/${id}/samples${query}`), params({ id: String(id) }));

describe("recordings API", () => {
  it("uploads a multipart CSV, lists it and gives the exact samples back as float64 LE and JSON", async () => {
    actAs(users.engineer);
    const res = await upload(multipart({ channel: CHANNEL, notes: "idle, motors off" }, csv()));
    expect(res.status).toBe(201);
    const saved = await res.json();
    expect(saved).toMatchObject({ channelPath: CHANNEL, name: "bench-run", notes: "idle, motors off", sampleRateHz: 1000, sampleCount: 6, missingCount: 1, rateSource: "inferred", time: "t_s" });
    expect(saved.column.unit).toBe("N·m");

    actAs(users.operator);
    const listed = await (await list(`?channel=${CHANNEL}`)).json();
    expect(listed.map((r: { id: number }) => r.id)).toContain(saved.id);
    expect(listed[0]).not.toHaveProperty("samples");

    const bin = await samples(saved.id);
    expect(bin.headers.get("content-type")).toBe("application/octet-stream");
    expect(bin.headers.get("x-sample-rate-hz")).toBe("1000");
    const back = decodeSamples(new Uint8Array(await bin.arrayBuffer()));
    expect([...back].every((v, i) => Object.is(v, VALUES[i]))).toBe(true);

    const json = await (await samples(saved.id, "?format=json")).json();
    expect(json.samples).toEqual([0.125, -1.5, 3.25e-3, null, 42, 1e-9]);
  });

  it("takes a text/csv body with the fields and a given rate in the query", async () => {
    actAs(users.engineer);
    const res = await upload(csvRequest(`channel=${CHANNEL}&name=Raw%20column&sampleRateHz=1000`, "torque[N·m]\n1\n2\n3\n"));
    expect(res.status).toBe(201);
    expect(await res.json()).toMatchObject({ name: "Raw column", sampleCount: 3, rateSource: "given", time: "none" });
  });

  it("refuses a file at the wrong rate with both rates, storing nothing", async () => {
    actAs(users.engineer);
    const before = await lab.db.selectFrom("recordings").select((eb) => eb.fn.countAll<string>().as("n")).executeTakeFirstOrThrow();
    const res = await upload(multipart({ channel: CHANNEL }, csv(VALUES, 500)));
    expect(res.status).toBe(422);
    const body = await res.json();
    expect(body.error.message).toMatch(/500 Hz .* 1000 Hz/);
    expect(body.error.details[0]).toMatchObject({ path: "file" });
    const garbage = await (await upload(multipart({ channel: CHANNEL }, "t_s,x\n0,1\n0.001,zz\n"))).json();
    expect(garbage.error.details[0]).toMatchObject({ line: 3, column: "x" });
    const after = await lab.db.selectFrom("recordings").select((eb) => eb.fn.countAll<string>().as("n")).executeTakeFirstOrThrow();
    expect(after.n).toBe(before.n);
  });

  it("refuses an oversize upload before parsing it", async () => {
    actAs(users.engineer);
    const big = "x\n" + "1\n".repeat(MAX_UPLOAD_BYTES / 2);
    const res = await upload(csvRequest(`channel=${CHANNEL}&sampleRateHz=1000`, big));
    expect(res.status).toBe(413);
    expect((await res.json()).error.message).toMatch(/at most 20\.0 MB/);
  });

  it("answers 401 without a session and 403 to an operator's upload", async () => {
    actAs(null);
    expect((await upload(multipart({ channel: CHANNEL }, csv()))).status).toBe(401);
    expect((await list()).status).toBe(401);
    actAs(users.operator);
    expect((await upload(multipart({ channel: CHANNEL }, csv()))).status).toBe(403);
  });

  it("lets the author or a lead delete (an operator may not) and audits create and delete", async () => {
    actAs(users.engineer);
    const { id } = await (await upload(multipart({ channel: CHANNEL, name: "To delete" }, csv()))).json();
    const del = (user: Accounts[keyof Accounts]) => {
      actAs(user);
      return oneRoute.DELETE(new Request(`http://test.local/api/v1/recordings/${id}`, { method: "DELETE", headers: SAME_ORIGIN }), params({ id: String(id) }));
    };
    expect((await del(users.operator)).status).toBe(403);
    expect((await del(users.lead)).status).toBe(204);
    expect((await del(users.lead)).status).toBe(404);
    const audit = await lab.db.selectFrom("audit_log").select(["action", "actor_id"]).where("entity", "=", "recording").where("entity_id", "=", String(id)).orderBy("id").execute();
    expect(audit).toEqual([
      { action: "recording.create", actor_id: users.engineer.id },
      { action: "recording.delete", actor_id: users.lead.id },
    ]);
    expect((await samples(id)).status).toBe(404);
  });
});
