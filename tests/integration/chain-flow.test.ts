import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { findChannelByPath } from "@/db/queries/channels";
import { findActiveDeployment, findDeployment } from "@/db/queries/deployments";
import { deployedDesign } from "@/lib/coefficients";
import { createSet } from "@/db/workflow/sets";
import { readQuantized } from "@/db/json-columns";
import { buildRevisionContent, channelConfigChecksum, type StoredCoefficients } from "@/lib/coefficients";
import { filterSignal, quantizedParts, simulateFixed, type FilterSpec } from "@/lib/dsp";
import { systemClock } from "@/server/clock";
import { startDeploymentWorker, type DeploymentWorker } from "@/server/deploy/worker";
import { channelConfigChecksum as storedHash } from "@/server/devices/checksum";
import { PRODUCTION, type PendingBlock } from "@/server/pipeline/pipeline";
import type { Sidecar } from "@/server/sidecar";
import { firLowpass255, humChain, legacyFirRevision } from "../unit/coefficients-support";
import { compileAndRun, inputWords, scratch } from "../unit/gcc-support";
import { actAs, jsonRequest, params, setUpLab, type Accounts } from "./sets-fixture";
import { memoryLogger, retainedDocument, testSidecar } from "./sidecar-support";

vi.mock("@/db", async () => (await import("./sets-fixture")).dbModule);
vi.mock("@/app/_lib/auth", async () => (await import("./sets-fixture")).authModule);
const setsRoute = await import("@/app/api/v1/sets/route");
const transitionsRoute = await import("@/app/api/v1/revisions/[id]/transitions/route");
const promoteRoute = await import("@/app/api/v1/revisions/[id]/promote/route");
const exportRoute = await import("@/app/api/v1/revisions/[id]/export/route");

const STRAIN = "hydraulic-press/env-node/frame-strain"; // 1 kHz, q15, 16 sections and 256 taps; 50 Hz hum of 35 µε and 9 µε at 150 Hz
const PRESSURE = "hydraulic-press/press-ctl/line-pressure"; // 2 kHz, q31, 16 sections and 256 taps
const RAM = "hydraulic-press/press-ctl/ram-position"; // 2 kHz, q31, the small one: 4 sections and 128 taps
const TORQUE = "gearbox-endurance/torque-node/input-torque"; // 1 kHz, q15
const SPEED = "gearbox-endurance/torque-node/shaft-speed"; // 500 Hz, same device

let lab: Awaited<ReturnType<typeof setUpLab>>;
let users: Accounts;
let sidecar: Sidecar;
let worker: DeploymentWorker;
const gcc = scratch();

beforeAll(async () => {
  lab = await setUpLab("chain_flow");
  users = lab.users;
  // The sidecar as main.ts wires it: embedded broker, the demo rig's devices over MQTT, the live pipeline, the deployment worker.
  sidecar = await testSidecar(lab.db, { demo: { seed: 7 } });
  worker = await startDeploymentWorker({
    db: lab.db,
    databaseUrl: lab.url,
    exchange: sidecar.configs,
    bus: sidecar.bus,
    pipeline: sidecar.pipeline,
    clock: systemClock,
    logger: memoryLogger(),
    ackTimeoutMs: 5000,
  });
});
afterAll(async () => {
  await worker?.stop();
  await worker?.idle();
  await sidecar?.close();
  await lab?.close();
  gcc.remove();
});

async function post(route: { POST: (req: Request, ctx: never) => Promise<Response> }, url: string, body: unknown, id?: number) {
  return route.POST(jsonRequest("POST", url, body), (id === undefined ? undefined : params({ id: String(id) })) as never);
}

/** Saves a set through POST /api/v1/sets as the engineer; submitted by the engineer and approved by the lead through the API. */
async function approvedThroughApi(channel: string, name: string, spec: FilterSpec): Promise<number> {
  actAs(users.engineer);
  const created = await post(setsRoute, "/api/v1/sets", { channel, name, spec });
  expect(created.status).toBe(201);
  const { revisionId } = (await created.json()) as { revisionId: number };
  expect((await post(transitionsRoute, `/api/v1/revisions/${revisionId}/transitions`, { action: "submit", expectedVersion: 1 }, revisionId)).status).toBe(200);
  actAs(users.lead);
  const approve = { action: "approve", expectedVersion: 2, comment: "hum and noise gone" };
  expect((await post(transitionsRoute, `/api/v1/revisions/${revisionId}/transitions`, approve, revisionId)).status).toBe(200);
  return revisionId;
}

/** Promotes through POST /api/v1/revisions/{id}/promote as the lead and waits until the deployment left pending. */
async function promoteThroughApi(revisionId: number, channel: string) {
  actAs(users.lead);
  const res = await post(promoteRoute, `/api/v1/revisions/${revisionId}/promote`, { channels: [channel] }, revisionId);
  expect(res.status).toBe(202);
  const { deployments } = (await res.json()) as { deployments: { id: number }[] };
  await vi.waitFor(
    async () => {
      await worker.idle();
      expect((await findDeployment(lab.db, deployments[0].id))?.state).not.toBe("pending");
    },
    { timeout: 10_000, interval: 50 },
  );
  return (await findDeployment(lab.db, deployments[0].id))!;
}

/** |DFT| of x at f over its whole length (one bin; x should hold whole periods of f). */
function toneAmplitude(x: ArrayLike<number>, f: number, fs: number): number {
  let re = 0;
  let im = 0;
  for (let n = 0; n < x.length; n++) {
    re += x[n] * Math.cos((2 * Math.PI * f * n) / fs);
    im -= x[n] * Math.sin((2 * Math.PI * f * n) / fs);
  }
  return Math.hypot(re, im);
}

describe("a filter chain from the API to the device, the production trace and the C header", () => {
  let revisionId: number;

  it("saves notch 50 Hz + notch 150 Hz + Butterworth low-pass through the API as one revision holding the chain", async () => {
    revisionId = await approvedThroughApi(STRAIN, "Strain hum chain", humChain);
    const row = await lab.db.selectFrom("revisions").select(["spec", "design", "quantized", "analysis", "state"]).where("id", "=", revisionId).executeTakeFirstOrThrow();
    expect(row.state).toBe("approved");
    expect(row.spec).toEqual(humChain);
    const quantized = readQuantized(row.quantized, { table: "revisions", id: revisionId });
    expect(quantized?.stages?.map((s) => s.integers?.length)).toEqual([1, 1, 2]);
    expect(row.analysis).toMatchObject({ stable: true, deployable: { ok: true } });
  });

  it("promotes it to env-node/frame-strain; the demo device checks the v3 document and acknowledges", async () => {
    const deployment = await promoteThroughApi(revisionId, STRAIN);
    expect(deployment).toMatchObject({ state: "active", format: "q15", revisionId });
    const document = await retainedDocument(sidecar.mqttUrl, "hydraulic-press", "env-node");
    expect(document).toMatchObject({ v: 3, configId: String(deployment.id) });
    const entry = document?.channels["frame-strain"];
    expect(entry?.stages.map((s) => s.kind)).toEqual(["sections", "sections", "sections"]);
    expect(entry).toEqual(deployment.config);
    expect(await channelConfigChecksum(entry!)).toBe(deployment.checksum);
  });

  it("runs the chain as the channel's production filter: its output is filterSignal of the deployed chain, and the hum is gone", async () => {
    expect(sidecar.pipeline.productionRevision(STRAIN)).toBe(String(revisionId));
    // The sidecar's timers are off, so every block since it started is still pending; the first with a production
    // trace starts where the filter was switched in, and the filter's state runs on across blocks (and lost batches).
    // Drained blocks are views valid until the channel's next batch: keep copies.
    const kept = (drained: PendingBlock[]) =>
      drained.map((b) => ({ ...b, raw: b.raw.slice(), traces: new Map([...b.traces].map(([key, t]) => [key, t.slice()])) }));
    let blocks = kept(sidecar.pipeline.drain(STRAIN));
    await vi.waitFor(
      () => {
        blocks = [...blocks, ...kept(sidecar.pipeline.drain(STRAIN))];
        expect(blocks.reduce((n, b) => n + (b.traces.get(PRODUCTION)?.length ?? 0), 0)).toBeGreaterThan(3000);
      },
      { timeout: 10_000, interval: 100 },
    );
    const since = blocks.slice(blocks.findIndex((b) => b.traces.has(PRODUCTION)));
    const raw = since.flatMap((b) => Array.from(b.raw));
    const production = since.flatMap((b) => Array.from(b.traces.get(PRODUCTION) ?? []));
    expect(production).toHaveLength(raw.length);
    const active = (await findActiveDeployment(lab.db, (await findChannelByPath(lab.db, STRAIN))!.id))!;
    const design = deployedDesign(active)!;
    expect(design.stages).toHaveLength(3);
    expect(production).toEqual(Array.from(filterSignal(design, Float64Array.from(raw), { initial: "step" })));
    const last = raw.length - 2000; // the last two seconds, long after the filter settled: 100 periods of 50 Hz
    const tail = production.slice(last);
    const rawTail = raw.slice(last);
    const drop = (f: number) => 20 * Math.log10(toneAmplitude(tail, f, 1000) / toneAmplitude(rawTail, f, 1000));
    expect(drop(50)).toBeLessThan(-30);
    expect(drop(150)).toBeLessThan(-20);
  });

  it("exports the revision as a C header that holds every section and compiles with gcc, bit-true with simulateFixed", async () => {
    actAs(users.operator);
    const res = await exportRoute.GET(new Request(`http://test.local/api/v1/revisions/${revisionId}/export?format=c-header`), params({ id: String(revisionId) }));
    expect(res.status).toBe(200);
    const header = await res.text();
    const row = await lab.db.selectFrom("revisions").select("quantized").where("id", "=", revisionId).executeTakeFirstOrThrow();
    const quantized = readQuantized(row.quantized, { table: "revisions", id: revisionId });
    if (!quantized) throw new Error("the chain was saved without a quantized form");
    const sections = quantizedParts(quantized).flatMap((p) => p.integers ?? []);
    expect(sections).toHaveLength(4);
    sections.forEach((words, k) => expect(header).toMatch(new RegExp(`/\\* stage \\d, section ${k} \\*/ ${words.join(", ")},\\n`)));
    expect(header).toContain("#define STRAIN_HUM_CHAIN_R1_Q15_STAGES 3\n");
    const input = inputWords(15, 400);
    const got = compileAndRun(gcc.dir, "strain_hum_chain_r1_q15", header, input.map(String), "int16_t", "%lld", "long long").map(Number);
    const expected = simulateFixed(quantized, Float64Array.from(input, (w) => w / 2 ** 15));
    expect(got).toEqual(Array.from(expected.y, (y) => y * 2 ** 15));
  });
});

describe("channel capacity and FIR stages", () => {
  it("refuses a chain that does not fit the channel, with the numbers (422)", async () => {
    const chain: FilterSpec = {
      kind: "chain",
      sampleRateHz: 2000,
      stages: [
        { kind: "biquad", shape: "notch", centerHz: 225, q: 5, sampleRateHz: 2000 },
        { kind: "iir", family: "butterworth", response: "lowpass", order: 12, cutoffHz: 400, sampleRateHz: 2000 },
        { ...firLowpass255, cutoffHz: 300, sampleRateHz: 2000 },
      ],
    };
    const id = await approvedThroughApi(PRESSURE, "Pressure ripple chain", chain);
    actAs(users.lead);
    const res = await post(promoteRoute, `/api/v1/revisions/${id}/promote`, { channels: [RAM] }, id);
    expect(res.status).toBe(422);
    expect((await res.json()).error.message).toBe(
      `Refused for ${RAM}: the filter needs 7 sections and 255 FIR taps; press-ctl/ram-position takes at most 4 sections and 128 FIR taps.`,
    );
    expect(await lab.db.selectFrom("deployments").select("id").where("revision_id", "=", id).execute()).toEqual([]);
    expect(await promoteThroughApi(id, PRESSURE)).toMatchObject({ state: "active" }); // its own channel takes 16 sections and 256 taps
  });

  it("promotes a 255-tap FIR as taps to a channel that takes them; the device acknowledges and production runs the taps", async () => {
    const id = await approvedThroughApi(STRAIN, "Strain FIR 255", firLowpass255);
    const deployment = await promoteThroughApi(id, STRAIN);
    expect(deployment.state).toBe("active");
    const entry = (await retainedDocument(sidecar.mqttUrl, "hydraulic-press", "env-node"))?.channels["frame-strain"];
    expect(entry?.stages).toHaveLength(1);
    const stage = entry?.stages[0];
    expect(stage?.kind === "fir" && !Array.isArray(stage.taps) ? stage.taps.words.length : 0).toBe(255);
    expect(deployedDesign(deployment)?.taps).toHaveLength(255);
    expect(sidecar.pipeline.productionRevision(STRAIN)).toBe(String(id));
  });
});

describe("revisions and deployments saved before chains", () => {
  it("an old-shape FIR revision (stored as sections) promotes exactly as stored, beside an old-shape active entry on the same device", async () => {
    const speed = (await findChannelByPath(lab.db, SPEED))!;
    const torque = (await findChannelByPath(lab.db, TORQUE))!;
    // An active deployment written by the previous version: a v2 entry (one list of sections) with its checksum.
    const oldSpeedRev = await savedRevision(speed.id, "Speed LP (old)", {
      kind: "iir",
      family: "butterworth",
      response: "lowpass",
      order: 2,
      cutoffHz: 40,
      sampleRateHz: 500,
    });
    const oldStored = await lab.db.selectFrom("revisions").select("quantized").where("id", "=", oldSpeedRev).executeTakeFirstOrThrow();
    const oldQuantized = readQuantized(oldStored.quantized, { table: "revisions", id: oldSpeedRev });
    if (!oldQuantized) throw new Error("the old revision was saved without a quantized form");
    const legacyEntry = {
      revisionId: String(oldSpeedRev),
      format: "q15" as const,
      sampleRateHz: 500,
      sections: (oldQuantized.integers ?? []).map((words, i) => ({ words, shift: oldQuantized.shifts[i] })),
    };
    await lab.db
      .insertInto("deployments")
      .values({ revision_id: oldSpeedRev, channel_id: speed.id, kind: "promote", state: "active", format: "q15", config: JSON.stringify(legacyEntry), checksum: storedHash(legacyEntry), previous_id: null, requested_by: users.lead.id })
      .execute();

    // A revision written by the previous version: an FIR design with taps, its q15 form stored as sections.
    const legacy = legacyFirRevision();
    const oldFirRev = await savedRevision(torque.id, "Torque FIR (old)", { ...firLowpass255, taps: 31 }, legacy);
    const deployment = await promoteThroughApi(oldFirRev, TORQUE);
    expect(deployment.state).toBe("active");
    const document = await retainedDocument(sidecar.mqttUrl, "gearbox-endurance", "torque-node");
    expect(document?.channels["input-torque"]).toEqual({
      revisionId: String(oldFirRev),
      format: "q15",
      sampleRateHz: 1000,
      stages: [{ kind: "sections", sections: (legacy.quantized?.integers ?? []).map((words, i) => ({ words, shift: legacy.quantized!.shifts[i] })) }],
    });
    expect(document?.channels["shaft-speed"]).toEqual({ revisionId: String(oldSpeedRev), format: "q15", sampleRateHz: 500, stages: [{ kind: "sections", sections: legacyEntry.sections }] });
    const stored = await lab.db.selectFrom("deployments").select(["config", "checksum"]).where("channel_id", "=", speed.id).executeTakeFirstOrThrow();
    expect(stored).toEqual({ config: legacyEntry, checksum: storedHash(legacyEntry) }); // untouched
    const speedActive = (await findActiveDeployment(lab.db, speed.id))!;
    expect(deployedDesign(speedActive)?.sos).toEqual(oldQuantized.sos);
  });
});

/**
 * Writes an approved revision with the given content, as the version that wrote it stored it (createSet
 * stores the content's JSON as given); the content defaults to what buildRevisionContent makes now.
 */
async function savedRevision(channelId: number, name: string, spec: FilterSpec, stored?: StoredCoefficients): Promise<number> {
  const now = buildRevisionContent(spec, "q15");
  const content = stored ? { ...now, design: stored.design, quantized: stored.quantized } : now;
  const input = { spec, content, notes: "", format: "q15" as const, sampleRateHz: spec.sampleRateHz };
  const saved = await lab.db.transaction().execute((trx) => createSet(trx, users.engineer, channelId, name, input));
  await lab.db.updateTable("revisions").set({ state: "approved" }).where("id", "=", saved.revisionId).execute();
  return saved.revisionId;
}
