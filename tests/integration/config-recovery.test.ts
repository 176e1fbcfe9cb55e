import { resolve } from "node:path";
import mqtt from "mqtt";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { findChannelByPath } from "@/db/queries/channels";
import { requestPromotion } from "@/db/workflow/deployments";
import { transitionRevision } from "@/db/workflow/review";
import { createSet } from "@/db/workflow/sets";
import { seedDemoDeviceCredentials } from "@/db/seed-device-credentials";
import { buildRevisionContent } from "@/lib/coefficients";
import { demoDeviceCredential } from "@/lib/demo/device-credentials";
import { DEMO_RIGS } from "@/lib/demo/lab";
import { configTopic, deviceConfigSchema, type DeviceConfig } from "@/lib/protocol";
import { systemClock } from "@/server/clock";
import { startDeploymentWorker, type DeploymentWorker } from "@/server/deploy/worker";
import type { Sidecar, SidecarOptions } from "@/server/sidecar";
import { butterSpec, setUpLab, type Accounts } from "./sets-fixture";
import { memoryLogger, mosquitto, SECRET, testSidecar, until } from "./sidecar-support";

const STRAIN = "hydraulic-press/env-node/frame-strain";
const ENV_NODE = "hydraulic-press/env-node";

let lab: Awaited<ReturnType<typeof setUpLab>>;
let users: Accounts;

beforeAll(async () => {
  lab = await setUpLab("config_recovery");
  users = lab.users;
  await seedDemoDeviceCredentials(lab.db, SECRET);
});
afterAll(async () => lab?.close());

/** A sidecar with the demo rig and its deployment worker, as server/main.ts wires them. */
async function start(mqttSetup: SidecarOptions["mqtt"]): Promise<{ sidecar: Sidecar; worker: DeploymentWorker; stop: () => Promise<void> }> {
  const sidecar = await testSidecar(lab.db, { mqtt: mqttSetup, demo: { seed: 7 } });
  const worker = await startDeploymentWorker({
    db: lab.db,
    databaseUrl: lab.url,
    exchange: sidecar.configs,
    bus: sidecar.bus,
    pipeline: sidecar.pipeline,
    clock: systemClock,
    logger: memoryLogger(),
    ackTimeoutMs: 5000,
  });
  return {
    sidecar,
    worker,
    stop: async () => {
      await worker.stop();
      await worker.idle();
      await sidecar.close();
    },
  };
}

/** Saves, approves and promotes a Butterworth low-pass on frame-strain; resolves with the deployment id once it is active. */
async function promoteStrain(name: string, cutoffHz: number): Promise<{ deploymentId: number; revisionId: number }> {
  const channel = (await findChannelByPath(lab.db, STRAIN))!;
  const spec = butterSpec(cutoffHz);
  const content = buildRevisionContent(spec, channel.coefficientFormat);
  const input = { spec, content, notes: "", format: channel.coefficientFormat, sampleRateHz: channel.sampleRateHz };
  const saved = await lab.db.transaction().execute((trx) => createSet(trx, users.engineer, channel.id, name, input));
  await lab.db.transaction().execute((trx) => transitionRevision(trx, users.engineer, { revisionId: saved.revisionId, action: "submit", expectedVersion: 1 }));
  await lab.db.transaction().execute((trx) => transitionRevision(trx, users.lead, { revisionId: saved.revisionId, action: "approve", expectedVersion: 2, comment: "ok" }));
  const { deployments } = await lab.db.transaction().execute((trx) => requestPromotion(trx, users.lead, saved.revisionId, [STRAIN]));
  const id = deployments[0].id;
  for (let i = 0; i < 200; i++) {
    const row = await lab.db.selectFrom("deployments").select("state").where("id", "=", id).executeTakeFirstOrThrow();
    if (row.state === "active") return { deploymentId: id, revisionId: saved.revisionId };
    if (row.state !== "pending") throw new Error(`deployment ${id} ended ${row.state}`);
    await new Promise((r) => setTimeout(r, 50));
  }
  throw new Error(`deployment ${id} still pending`);
}

/** The retained config document a newly connecting client receives for env-node. */
async function retainedDocument(url: string, credentials: { username: string; password: string }): Promise<DeviceConfig> {
  const client = await mqtt.connectAsync(url, { ...credentials, reconnectPeriod: 0 });
  try {
    return await new Promise<DeviceConfig>((resolveDoc, reject) => {
      const timer = setTimeout(() => reject(new Error("no retained config document")), 5000);
      client.on("message", (_topic, payload) => {
        clearTimeout(timer);
        resolveDoc(deviceConfigSchema.parse(JSON.parse(payload.toString("utf8"))));
      });
      client.subscribe(configTopic("hydraulic-press", "env-node"), { qos: 1 });
    });
  } finally {
    await client.endAsync();
  }
}

/** The database and the retained document agree: frame-strain carries the active revision with the stored checksum. */
async function expectRetainedMatchesDatabase(doc: DeviceConfig, deploymentId: number, revisionId: number): Promise<void> {
  const row = await lab.db.selectFrom("deployments").select(["config", "checksum"]).where("id", "=", deploymentId).executeTakeFirstOrThrow();
  expect(doc.configId).toBe(`active-${deploymentId}`);
  expect(doc.channels["frame-strain"]).toEqual(row.config);
  expect(doc.channels["frame-strain"]?.revisionId).toBe(String(revisionId));
}

describe("the database is the truth devices are brought back to", () => {
  it("after a sidecar restart (embedded broker, retained messages lost) every device gets its active config again and applies it", async () => {
    const first = await start({ mode: "embedded", host: "127.0.0.1", port: 0, requireDeviceAuth: true, internal: [] });
    const { deploymentId, revisionId } = await promoteStrain("Strain LP 100", 100);
    await until(() => first.sidecar.demo?.appliedConfigId(ENV_NODE) === String(deploymentId), 5000, "the demo device applying the promotion");
    await first.stop();

    const monitor = { username: "monitor", password: "monitor-secret-0123456789" };
    const second = await start({ mode: "embedded", host: "127.0.0.1", port: 0, requireDeviceAuth: true, internal: [monitor] });
    try {
      await until(() => second.sidecar.demo?.appliedConfigId(ENV_NODE) === `active-${deploymentId}`, 10_000, "the rebooted demo device applying its config");
      await expectRetainedMatchesDatabase(await retainedDocument(second.sidecar.mqttUrl, monitor), deploymentId, revisionId);
      // Every demo device has a retained document, pass-through where nothing is active.
      for (const rig of DEMO_RIGS) {
        for (const device of rig.devices) {
          const key = `${rig.key}/${device.key}`;
          await until(() => second.sidecar.demo?.appliedConfigId(key) !== undefined, 5000, key);
          if (key !== ENV_NODE) expect(second.sidecar.demo?.appliedConfigId(key)).toBe("active-none");
        }
      }
    } finally {
      await second.stop();
    }
  });

  it("after a mosquitto restart (retained messages lost) the sidecar republishes on reconnect and the device applies it", async () => {
    const sidecarUser = { username: "tapwright-sidecar", password: "sidecar-secret-0123456789" };
    const devices = DEMO_RIGS.flatMap((r) => r.devices.map((d) => demoDeviceCredential(SECRET, r.key, d.key)));
    const broker = await mosquitto({ users: [sidecarUser, ...devices], aclFile: resolve("docs/mosquitto-acl.conf") });
    const running = await start({ mode: "external", url: broker.url, ...sidecarUser, backoffMs: { initial: 100, max: 500 } });
    try {
      const { deploymentId, revisionId } = await promoteStrain("Strain LP 90", 90);
      await until(() => running.sidecar.demo?.appliedConfigId(ENV_NODE) === String(deploymentId), 5000, "the demo device applying the promotion");
      await broker.stop();
      await broker.start();
      await until(() => running.sidecar.demo?.appliedConfigId(ENV_NODE) === `active-${deploymentId}`, 15_000, "the device applying the republished config");
      await expectRetainedMatchesDatabase(await retainedDocument(broker.url, sidecarUser), deploymentId, revisionId);
    } finally {
      await running.stop();
      await broker.stop();
    }
  });
});
