import { Aedes } from "aedes";
import { sql } from "kysely";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { findChannelByPath } from "@/db/queries/channels";
import { findActiveDeployment, requestPromotion, requestRollback } from "@/db/queries/deployments";
import { transitionRevision } from "@/db/queries/revisions";
import { createSet } from "@/db/queries/sets";
import { buildRevisionContent } from "@/lib/coefficients";
import type { FilterDesign, FilterSpec } from "@/lib/dsp";
import { DEMO_RIGS } from "@/lib/demo/lab";
import { ackTopic, parseTopic, type DeviceConfig } from "@/lib/protocol";
import type { MessageBus } from "@/server/broker/bus";
import { inProcessBus } from "@/server/broker/embedded";
import { systemClock, type Logger } from "@/server/clock";
import { startDeploymentWorker, type DeploymentWorker } from "@/server/deploy/worker";
import { createConfigExchange } from "@/server/devices/config-exchange";
import { answerConfig } from "@/server/demo-rig/config-handler";
import { actAs, butterSpec, jsonRequest, params, pathParams, setUpLab, type Accounts } from "./sets-fixture";

vi.mock("@/db", async () => (await import("./sets-fixture")).dbModule);
vi.mock("@/app/_lib/auth", async () => (await import("./sets-fixture")).authModule);
const productionRoute = await import("@/app/api/v1/channels/[rig]/[device]/[channel]/production/route");
const promoteRoute = await import("@/app/api/v1/revisions/[id]/promote/route");

const TORQUE = "gearbox-endurance/torque-node/input-torque";
const STRAIN = "hydraulic-press/env-node/frame-strain";
const PRESSURE = "hydraulic-press/press-ctl/line-pressure";

let lab: Awaited<ReturnType<typeof setUpLab>>;
let users: Accounts;
let broker: Aedes;
let bus: MessageBus;
let worker: DeploymentWorker;
const silentDevices = new Set<string>();
const productionCalls: { path: string; revisionId: string; design: FilterDesign | null }[] = [];
const logger: Logger = { info: () => undefined, warn: () => undefined };

/** Demo devices on the in-process bus: the pipeline engineer's answerConfig checks and acks every config. */
async function startDevices(): Promise<void> {
  await bus.subscribe("tapwright/v1/+/+/config", (topic, payload) => {
    const t = parseTopic(topic);
    if (!t || t.kind !== "config" || silentDevices.has(`${t.rig}/${t.device}`)) return;
    const device = DEMO_RIGS.find((r) => r.key === t.rig)?.devices.find((d) => d.key === t.device);
    const ack = device && answerConfig(device, payload);
    if (ack) void bus.publish(ackTopic(t.rig, t.device), JSON.stringify(ack), { qos: 1 });
  });
}

beforeAll(async () => {
  lab = await setUpLab("deploy_flow");
  users = lab.users;
  broker = await Aedes.createBroker();
  bus = inProcessBus(broker);
  await startDevices();
  const exchange = await createConfigExchange({ bus, clock: systemClock, logger });
  worker = await startDeploymentWorker({
    db: lab.db,
    databaseUrl: lab.url,
    exchange,
    bus,
    pipeline: { setProductionFilter: (path, revisionId, design) => productionCalls.push({ path, revisionId, design }) },
    clock: systemClock,
    logger,
    ackTimeoutMs: 300,
  });
});
afterAll(async () => {
  await worker.stop();
  await worker.idle();
  await new Promise<void>((r) => broker.close(() => r()));
  await lab.close();
});

/** Saves, submits and approves a revision on the torque channel (q15 device); returns its id. */
async function approvedRevision(name: string, spec: FilterSpec = butterSpec()): Promise<number> {
  const channel = (await findChannelByPath(lab.db, TORQUE))!;
  const content = buildRevisionContent(spec, channel.coefficientFormat);
  const input = { spec, content, notes: "", format: channel.coefficientFormat, sampleRateHz: channel.sampleRateHz };
  const saved = await lab.db.transaction().execute((trx) => createSet(trx, users.engineer, channel.id, name, input));
  await lab.db.transaction().execute((trx) => transitionRevision(trx, users.engineer, { revisionId: saved.revisionId, action: "submit", expectedVersion: 1 }));
  await lab.db.transaction().execute((trx) =>
    transitionRevision(trx, users.lead, { revisionId: saved.revisionId, action: "approve", expectedVersion: 2, comment: "ok" }),
  );
  return saved.revisionId;
}

async function promote(revisionId: number, channels: string[]) {
  return lab.db.transaction().execute((trx) => requestPromotion(trx, users.lead, revisionId, channels));
}

async function deploymentState(id: number): Promise<{ state: string; reason: string | null }> {
  await vi.waitFor(async () => {
    await worker.idle();
    const row = await lab.db.selectFrom("deployments").select("state").where("id", "=", id).executeTakeFirstOrThrow();
    expect(row.state).not.toBe("pending");
  }, { timeout: 5000, interval: 50 });
  return lab.db.selectFrom("deployments").select(["state", "reason"]).where("id", "=", id).executeTakeFirstOrThrow();
}

async function activeRevision(path: string): Promise<number | undefined> {
  const channel = (await findChannelByPath(lab.db, path))!;
  return (await findActiveDeployment(lab.db, channel.id))?.revisionId;
}

let first: number;
let second: number;

describe("promotion through the device's acknowledgement", () => {
  it("makes an approved revision active on two 1 kHz channels once each device acks, and switches the pipeline", async () => {
    first = await approvedRevision("Torque LP 100");
    const { deployments } = await promote(first, [TORQUE, STRAIN]);
    for (const d of deployments) expect(await deploymentState(d.id)).toMatchObject({ state: "active" });
    expect(await activeRevision(TORQUE)).toBe(first);
    expect(await activeRevision(STRAIN)).toBe(first);
    const call = productionCalls.find((c) => c.path === TORQUE && c.revisionId === String(first));
    expect(call?.design?.sos?.length).toBe(1);

    actAs(users.operator);
    const res = await productionRoute.GET(jsonRequest("GET", `/api/v1/channels/${TORQUE}/production`), params(pathParams(TORQUE)));
    expect(res.status).toBe(200);
    expect(await res.json()).toMatchObject({ revisionId: first, revision: 1, setName: "Torque LP 100", spec: butterSpec() });

    const audit = await lab.db.selectFrom("audit_log").select("action").where("entity", "=", "deployment").execute();
    expect(audit.map((a) => a.action)).toEqual(expect.arrayContaining(["deployment.request", "deployment.activate"]));
    const mail = await lab.db.selectFrom("mail_outbox").select(["kind", "recipients"]).where("kind", "=", "promoted").execute();
    expect(mail[0].recipients).toEqual(expect.arrayContaining(["engineer@tapwright.test", "lead@tapwright.test"]));
  });

  it("supersedes the previous active deployment when a new revision is acknowledged", async () => {
    second = await approvedRevision("Torque LP 80", butterSpec(80));
    const { deployments } = await promote(second, [TORQUE]);
    expect(await deploymentState(deployments[0].id)).toMatchObject({ state: "active" });
    expect(await activeRevision(TORQUE)).toBe(second);
    const states = await lab.db.selectFrom("deployments").select(["revision_id", "state"]).where("revision_id", "=", first).execute();
    expect(states.map((s) => s.state).sort()).toEqual(["active", "superseded"]); // strain still runs the first
  });

  it("rolls back to the previously active revision through the same acknowledged path", async () => {
    const channel = (await findChannelByPath(lab.db, TORQUE))!;
    const active = (await findActiveDeployment(lab.db, channel.id))!;
    const rb = await lab.db.transaction().execute((trx) => requestRollback(trx, users.lead, TORQUE, active.id));
    expect(await deploymentState(rb.id)).toMatchObject({ state: "active" });
    expect(await activeRevision(TORQUE)).toBe(first);
    const old = await lab.db.selectFrom("deployments").select("state").where("id", "=", active.id).executeTakeFirstOrThrow();
    expect(old.state).toBe("rolled_back");
    expect(productionCalls.at(-1)).toMatchObject({ path: TORQUE, revisionId: String(first) });
    await expect(
      lab.db.transaction().execute((trx) => requestRollback(trx, users.lead, TORQUE, active.id)),
    ).rejects.toMatchObject({ code: "conflict" });
  });

  it("fails on an ack timeout and keeps the previous revision active", async () => {
    silentDevices.add("gearbox-endurance/torque-node");
    try {
      const { deployments } = await promote(second, [TORQUE]);
      const outcome = await deploymentState(deployments[0].id);
      expect(outcome.state).toBe("failed");
      expect(outcome.reason).toMatch(/no acknowledgement .* within 0.3 s/);
      expect(await activeRevision(TORQUE)).toBe(first);
      const retained = await retainedConfig("gearbox-endurance", "torque-node");
      expect(retained?.revisionId).toBe(String(first));
      const mail = await lab.db.selectFrom("mail_outbox").select("subject").where("kind", "=", "failed").execute();
      expect(mail.length).toBe(1);
    } finally {
      silentDevices.delete("gearbox-endurance/torque-node");
    }
  });

  it("fails when the device refuses a corrupted checksum", async () => {
    const channel = (await findChannelByPath(lab.db, TORQUE))!;
    const active = (await findActiveDeployment(lab.db, channel.id))!;
    const corrupted = { ...active.config, checksum: "0".repeat(64) };
    const row = await lab.db
      .insertInto("deployments")
      .values({ revision_id: second, channel_id: channel.id, kind: "promote", format: "q15", config: JSON.stringify(corrupted), checksum: corrupted.checksum, previous_id: active.id, requested_by: users.lead.id })
      .returning("id")
      .executeTakeFirstOrThrow();
    await sql`select pg_notify('tapwright_deploy', ${String(row.id)})`.execute(lab.db);
    const outcome = await deploymentState(row.id);
    expect(outcome).toMatchObject({ state: "failed" });
    expect(outcome.reason).toMatch(/refused it: checksum mismatch/);
    expect(await activeRevision(TORQUE)).toBe(first);
  });
});

function retainedConfig(rig: string, device: string): Promise<DeviceConfig | null> {
  return new Promise((resolve) => {
    // aedes keeps retained messages in its persistence; its types do not declare the field.
    const { persistence } = broker as unknown as { persistence: { createRetainedStream(pattern: string): NodeJS.ReadableStream } };
    const stream = persistence.createRetainedStream(`tapwright/v1/${rig}/${device}/config`);
    let found: DeviceConfig | null = null;
    stream.on("data", (packet: { payload: Buffer } | string | Buffer) => {
      if (typeof packet === "string" || Buffer.isBuffer(packet)) return;
      if (packet.payload.length) found = JSON.parse(packet.payload.toString("utf8")) as DeviceConfig;
    });
    stream.on("end", () => resolve(found));
  });
}

describe("promotion refusals", () => {
  it("refuses a revision that is not approved (409), a sample-rate mismatch and an unstable revision (422)", async () => {
    const channel = (await findChannelByPath(lab.db, TORQUE))!;
    const spec = butterSpec(50);
    const draft = await lab.db.transaction().execute((trx) =>
      createSet(trx, users.engineer, channel.id, "draft", { spec, content: buildRevisionContent(spec, "q15"), notes: "", format: "q15", sampleRateHz: 1000 }),
    );
    await expect(promote(draft.revisionId, [TORQUE])).rejects.toMatchObject({ code: "conflict" });
    await expect(promote(first, [PRESSURE])).rejects.toMatchObject({ code: "unprocessable", message: expect.stringMatching(/sample-rate mismatch/) });
    const unstable = await approvedRevision("unstable", { kind: "coefficients", b: [1], a: [1, 0, 1.21], sampleRateHz: 1000 });
    await expect(promote(unstable, [TORQUE])).rejects.toMatchObject({ code: "unprocessable", message: expect.stringMatching(/unstable/) });
  });

  it("lets one of two leads promoting at once win; the other gets 409 (HTTP)", async () => {
    silentDevices.add("hydraulic-press/env-node");
    try {
      const call = (user: typeof users.lead) => {
        actAs(user);
        return promoteRoute.POST(jsonRequest("POST", `/api/v1/revisions/${second}/promote`, { channels: [STRAIN] }), {
          params: Promise.resolve({ id: String(second) }),
        });
      };
      const results = await Promise.all([call(users.lead), call(users.lead2)]);
      expect(results.map((r) => r.status).sort()).toEqual([202, 409]);
      const pending = await lab.db.selectFrom("deployments").select("id").where("state", "=", "pending").execute();
      expect(pending.length).toBeLessThanOrEqual(1);
      await worker.idle();
    } finally {
      silentDevices.delete("hydraulic-press/env-node");
    }
  });
});
