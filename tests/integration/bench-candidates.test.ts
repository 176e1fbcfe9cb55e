import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { listBenchCandidates } from "@/db/queries/bench-candidates";
import { findChannelByPath } from "@/db/queries/channels";
import { actAs, butterSpec, jsonRequest, params, pathParams, setUpLab, type Accounts } from "./sets-fixture";

vi.mock("@/db", async () => (await import("./sets-fixture")).dbModule);
vi.mock("@/app/_lib/auth", async () => (await import("./sets-fixture")).authModule);
const route = await import("@/app/api/v1/channels/[rig]/[device]/[channel]/candidates/[key]/route");

const TORQUE = "gearbox-endurance/torque-node/input-torque"; // 1 kHz

let lab: Awaited<ReturnType<typeof setUpLab>>;
let users: Accounts;
let channelId: number;
beforeAll(async () => {
  lab = await setUpLab("bench_candidates");
  users = lab.users;
  channelId = (await findChannelByPath(lab.db, TORQUE))!.id;
});
afterAll(() => lab.close());

const put = (key: string, body: unknown, path = TORQUE) =>
  route.PUT(jsonRequest("PUT", `/api/v1/channels/${path}/candidates/${key}`, body), params({ ...pathParams(path), key }));
const remove = (key: string) => route.DELETE(jsonRequest("DELETE", `/api/v1/channels/${TORQUE}/candidates/${key}`), params({ ...pathParams(TORQUE), key }));

describe("kept bench candidates", () => {
  it("keeps an engineer's candidates per channel, updates one by its key and forgets a removed one", async () => {
    actAs(users.engineer);
    expect((await put("cA", { spec: butterSpec(100), colorIndex: 0 })).status).toBe(200);
    expect((await put("cB", { spec: butterSpec(150), colorIndex: 1 })).status).toBe(200);
    expect((await put("cA", { spec: butterSpec(120), colorIndex: 0 })).status).toBe(200);
    expect(await listBenchCandidates(lab.db, users.engineer.id, channelId)).toEqual([
      { key: "cA", colorIndex: 0, spec: butterSpec(120) },
      { key: "cB", colorIndex: 1, spec: butterSpec(150) },
    ]);
    // Each engineer has their own bench.
    expect(await listBenchCandidates(lab.db, users.lead.id, channelId)).toEqual([]);
    expect((await remove("cB")).status).toBe(204);
    expect((await remove("cB")).status).toBe(204);
    expect((await listBenchCandidates(lab.db, users.engineer.id, channelId)).map((c) => c.key)).toEqual(["cA"]);
  });

  it("gives a new candidate whose colour is taken the first free one, and holds at most six per channel", async () => {
    actAs(users.engineer);
    const res = await put("cCarried", { spec: butterSpec(90), colorIndex: 0 });
    expect(await res.json()).toMatchObject({ key: "cCarried", colorIndex: 1 });
    for (const key of ["c3", "c4", "c5", "c6"]) expect((await put(key, { spec: butterSpec(80), colorIndex: 5 })).status).toBe(200);
    expect(new Set((await listBenchCandidates(lab.db, users.engineer.id, channelId)).map((c) => c.colorIndex)).size).toBe(6);
    const seventh = await put("c7", { spec: butterSpec(80), colorIndex: 0 });
    expect(seventh.status).toBe(409);
    expect((await seventh.json()).error.message).toMatch(/at most 6 candidates/);
  });

  it("refuses a spec that is not a filter spec, one for another sample rate, a bad key, and an operator", async () => {
    actAs(users.engineer);
    const bad = await put("cX", { spec: { ...butterSpec(100), order: 0 }, colorIndex: 0 });
    expect(bad.status).toBe(400);
    const rate = await put("cX", { spec: butterSpec(100, 500), colorIndex: 0 });
    expect(rate.status).toBe(422);
    expect((await rate.json()).error.message).toMatch(/500 Hz.*1000 Hz/);
    expect((await put("bad key!", { spec: butterSpec(100), colorIndex: 0 })).status).toBe(400);
    const tooManyTaps = await put("cX", { spec: { kind: "coefficients", b: Array.from({ length: 1025 }, () => 0.001), sampleRateHz: 1000 }, colorIndex: 0 });
    expect(tooManyTaps.status).toBe(400);
    expect((await put("cX", { spec: butterSpec(100), colorIndex: 0 }, "gearbox-endurance/torque-node/nowhere")).status).toBe(404);
    actAs(users.operator);
    expect((await put("cX", { spec: butterSpec(100), colorIndex: 0 })).status).toBe(403);
    expect((await listBenchCandidates(lab.db, users.engineer.id, channelId)).some((c) => c.key === "cX")).toBe(false);
  });
});
