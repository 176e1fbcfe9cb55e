import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { seedDemo } from "@/db/seed";
import { appOrigin, env } from "@/lib/env";
import { freshDb } from "./support/fresh-db";
import { actAs, state } from "./support/request-context";

vi.mock("server-only", () => ({}));
vi.mock("next/cache", () => ({ revalidatePath: () => undefined }));
vi.mock("next/headers", async () => (await import("./support/request-context")).nextHeaders);
vi.mock("@/db", async () => (await import("./support/request-context")).dbModule);
vi.mock("react", async (original) => ({ ...(await original<typeof import("react")>()), cache: <F>(fn: F) => fn }));

const setsRoute = await import("@/app/api/v1/sets/route");
const setRoute = await import("@/app/api/v1/sets/[id]/route");
const transitions = await import("@/app/api/v1/revisions/[id]/transitions/route");
const auditRoute = await import("@/app/api/v1/audit/route");
const recordingsRoute = await import("@/app/api/v1/recordings/route");
const loginRoute = await import("@/app/api/auth/login/route");
const setActions = await import("@/app/(lab)/sets/[id]/actions");

const CHANNEL = "gearbox-endurance/torque-node/input-torque";
const spec = { kind: "iir", family: "butterworth", response: "lowpass", order: 2, cutoffHz: 100, sampleRateHz: 1000 };
const own = () => ({ origin: appOrigin(env()), "content-type": "application/json" });
const none = undefined as never;

let fresh: Awaited<ReturnType<typeof freshDb>>;

beforeAll(async () => {
  fresh = await freshDb("bad_input");
  state.db = fresh.db;
  await seedDemo(fresh.db, "bad-input-password");
});
afterAll(() => fresh?.close());

async function as(role: "engineer" | "lead" | null): Promise<void> {
  await actAs(role && `${role}@tapwright.test`, own(), env().SESSION_SECRET);
}

const post = (url: string, body: BodyInit, headers: Record<string, string> = own()) =>
  new Request(`http://127.0.0.1:3000${url}`, { method: "POST", headers, body, duplex: "half" } as RequestInit);

async function error(res: Response): Promise<{ status: number; code: string; paths: string[] }> {
  const body = (await res.json()) as { error: { code: string; details?: Array<{ path: string }> } };
  return { status: res.status, code: body.error.code, paths: (body.error.details ?? []).map((d) => d.path) };
}

describe("bodies are bounded, and read only for a signed-in caller", () => {
  it("answers an anonymous 100 MB post with 401 without reading a byte of it", async () => {
    await as(null);
    let pulls = 0;
    const body = new ReadableStream<Uint8Array>({
      pull(c) {
        pulls++;
        c.enqueue(new Uint8Array(1 << 20));
      },
    });
    const res = await setsRoute.POST(post("/api/v1/sets", body, { ...own(), "content-length": String(100e6) }), none);
    expect(res.status).toBe(401);
    expect(pulls).toBeLessThanOrEqual(1);
  });

  it("refuses a signed-in engineer's JSON over MAX_JSON_BODY_BYTES with 413, by Content-Length or while streaming", async () => {
    await as("engineer");
    const declared = await setsRoute.POST(post("/api/v1/sets", "{}", { ...own(), "content-length": String(2e6) }), none);
    expect(await error(declared)).toMatchObject({ status: 413, code: "too_large" });
    await as("engineer");
    const big = JSON.stringify({ channel: CHANNEL, name: "x", notes: "n".repeat(1_100_000), spec });
    expect(await error(await setsRoute.POST(post("/api/v1/sets", big), none))).toMatchObject({ status: 413, code: "too_large" });
  });
});

describe("bad input answers 400 in the documented shape, never 500", () => {
  it("refuses a NUL byte or a lone surrogate in any text, with its path", async () => {
    for (const [field, value] of [["name", "hum\u0000notch"], ["notes", "lone \uD800 surrogate"], ["name", "\uDFFFx"]] as const) {
      await as("engineer");
      const res = await setsRoute.POST(post("/api/v1/sets", JSON.stringify({ channel: CHANNEL, name: "ok", spec, [field]: value })), none);
      expect(await error(res)).toEqual({ status: 400, code: "bad_request", paths: [field] });
    }
    await as("engineer");
    const key = await setsRoute.POST(post("/api/v1/sets", `{"channel":"${CHANNEL}","name":"ok","spec":${JSON.stringify(spec)},"x\\u0000":1}`), none);
    expect((await error(key)).status).toBe(400);
    await as("lead");
    const filter = await auditRoute.GET(new Request(`http://127.0.0.1:3000/api/v1/audit?actor=${encodeURIComponent("a\u0000")}`), none);
    expect(await error(filter)).toMatchObject({ status: 400, paths: ["actor"] });
  });

  it("refuses ids above 2³¹ − 1 in paths and bodies", async () => {
    await as("engineer");
    const res = await setRoute.GET(new Request("http://127.0.0.1:3000/api/v1/sets/2147483648"), { params: Promise.resolve({ id: "2147483648" }) });
    expect(await error(res)).toMatchObject({ status: 400, code: "bad_request" });
    await as("engineer");
    const body = JSON.stringify({ action: "submit", expectedVersion: 99999999999 });
    const tx = await transitions.POST(post("/api/v1/revisions/1/transitions", body), { params: Promise.resolve({ id: "1" }) });
    expect(await error(tx)).toMatchObject({ status: 400, paths: ["expectedVersion"] });
  });

  it("refuses impossible dates in the audit filters", async () => {
    for (const day of ["2026-02-30", "2026-13-01", "9999-99-99"]) {
      await as("lead");
      const res = await auditRoute.GET(new Request(`http://127.0.0.1:3000/api/v1/audit?from=${day}`), none);
      expect(await error(res), day).toMatchObject({ status: 400, paths: ["from"] });
    }
  });

  it("takes a recording file named only `.csv` under the channel's name, and refuses 1e999 like Infinity", async () => {
    const upload = (name: string, csv: string) => {
      const form = new FormData();
      form.set("channel", CHANNEL);
      form.set("file", new File([csv], name, { type: "text/csv" }));
      return recordingsRoute.POST(post("/api/v1/recordings", form, { origin: appOrigin(env()) }), none);
    };
    await as("engineer");
    const saved = await upload(".csv", "t_s,x\n0,1\n0.001,2\n0.002,3\n");
    expect(saved.status).toBe(201);
    expect((await saved.json()).name).toBe("Input torque upload");
    await as("engineer");
    const huge = await upload("huge.csv", "t_s,x\n0,1\n0.001,1e999\n0.002,3\n");
    expect(await error(huge)).toMatchObject({ status: 422, code: "unprocessable", paths: ["file"] });
  });

  it("refuses unstorable text in a server action's form as a field error", async () => {
    await actAs("engineer@tapwright.test", { origin: appOrigin(env()) }, env().SESSION_SECRET);
    const form = new FormData();
    form.set("setId", "1");
    form.set("expectedLatestRevision", "1");
    form.set("notes", "nul\u0000");
    form.set("spec", JSON.stringify(spec));
    const result = await setActions.reviseAction({ ok: true }, form);
    expect(result).toMatchObject({ ok: false, fieldErrors: { notes: expect.stringMatching(/NUL/) } });
  });

  it("answers a sign-in with NUL in the e-mail 400, not 500", async () => {
    await as(null);
    const res = await loginRoute.POST(post("/api/auth/login", JSON.stringify({ email: "a\u0000@b.test", password: "x" })), none);
    expect((await error(res)).status).toBe(400);
  });
});
