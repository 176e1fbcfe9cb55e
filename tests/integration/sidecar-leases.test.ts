import { fork, type ChildProcess } from "node:child_process";
import { fileURLToPath } from "node:url";
import mqtt, { type MqttClient } from "mqtt";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { listChannels, type ChannelRow } from "@/db/queries/channels";
import { findActiveDeployment } from "@/db/queries/deployments";
import { requestPromotion } from "@/db/workflow/deployments";
import { channelOwners } from "@/db/queries/leases";
import { transitionRevision } from "@/db/workflow/review";
import { createSet } from "@/db/workflow/sets";
import { buildRevisionContent } from "@/lib/coefficients";
import { DEMO_RIGS } from "@/lib/demo/lab";
import { ackTopic, deviceConfigSchema, parseTopic, samplesTopic } from "@/lib/protocol";
import { answerConfig } from "@/server/demo-rig/config-handler";
import { butterSpec, setUpLab, type Accounts } from "./sets-fixture";
import { cookieFor, mosquitto, openSocket, SECRET, until } from "./sidecar-support";

/** Ports of this test's own broker and sidecars (kept apart from the other suites' free ports). */
const MQTT_PORT = 18900;
const SIDECAR_PORTS: Record<string, number> = { "side-a": 3300, "side-b": 3301, "side-c": 3302 };
const TORQUE = "gearbox-endurance/torque-node/input-torque";
const CHILD = fileURLToPath(new URL("./support/lease-sidecar.ts", import.meta.url));

interface Filtered {
  id: string;
  path: string;
  seq: number;
  production: string | null;
  at: number;
}

let lab: Awaited<ReturnType<typeof setUpLab>>;
let users: Accounts;
let broker: Awaited<ReturnType<typeof mosquitto>>;
let channels: ChannelRow[];
let device: MqttClient;
let publishing: ReturnType<typeof setInterval>;
const sidecars = new Map<string, ChildProcess>();
const filtered: Filtered[] = [];
/** Acks the simulated devices sent, by configId. */
const acks = new Map<string, number>();

function startChild(id: string): Promise<void> {
  const child = fork(CHILD, [lab.url, broker.url, id, String(SIDECAR_PORTS[id]), SECRET], {
    execArgv: ["--import", "tsx"],
    stdio: ["ignore", "inherit", "inherit", "ipc"],
  });
  sidecars.set(id, child);
  return new Promise((resolve, reject) => {
    child.on("message", (m: { type: string } & Filtered) => {
      if (m.type === "ready") resolve();
      if (m.type === "filtered") filtered.push({ id: m.id, path: m.path, seq: m.seq, production: m.production, at: m.at });
    });
    child.once("exit", (code) => reject(new Error(`sidecar ${id} exited with ${code}`)));
  });
}

/** The simulated devices: every channel publishes 50 ms batches; every config document is answered as the demo rig does. */
async function startDevices(): Promise<void> {
  device = await mqtt.connectAsync(broker.url, { reconnectPeriod: 0 });
  device.on("message", (topic, payload) => {
    const t = parseTopic(topic);
    if (t?.kind !== "config" || !payload.length) return;
    const rig = DEMO_RIGS.find((r) => r.key === t.rig)?.devices.find((d) => d.key === t.device);
    const ack = rig && answerConfig(t.rig, rig, payload);
    if (!ack) return;
    const { configId } = deviceConfigSchema.parse(JSON.parse(payload.toString("utf8")));
    acks.set(configId, (acks.get(configId) ?? 0) + 1);
    void device.publishAsync(ackTopic(t.rig, t.device), JSON.stringify(ack), { qos: 1 });
  });
  await device.subscribeAsync("tapwright/v1/+/+/config", { qos: 1 });
  let seq = 0;
  publishing = setInterval(() => {
    for (const c of channels) {
      const n = Math.max(1, Math.round(c.sampleRateHz / 20));
      const values = Array.from({ length: n }, (_, i) => Math.sin((2 * Math.PI * (seq * n + i)) / 37));
      void device.publishAsync(samplesTopic(c.path), JSON.stringify({ seq, t0: 1_700_000_000_000 + seq * 50, sampleRateHz: c.sampleRateHz, values }));
    }
    seq++;
  }, 50);
}

async function owners(): Promise<Map<string, string>> {
  return new Map([...(await channelOwners(lab.db))].map(([path, o]) => [path, o.sidecarId]));
}

/** Waits until every channel has exactly one live owner among `ids`, each holding its fair share. */
async function balanced(ids: string[], timeoutMs: number): Promise<Map<string, string>> {
  let last = new Map<string, string>();
  const end = Date.now() + timeoutMs;
  for (;;) {
    last = await owners();
    const counts = ids.map((id) => [...last.values()].filter((o) => o === id).length);
    if (last.size === channels.length && [...last.values()].every((o) => ids.includes(o)) && Math.max(...counts) <= Math.ceil(channels.length / ids.length)) return last;
    if (Date.now() > end) throw new Error(`not balanced over ${ids.join(", ")}: ${JSON.stringify([...last])}`);
    await new Promise((r) => setTimeout(r, 100));
  }
}

async function approvedRevision(path: string): Promise<number> {
  const channel = channels.find((c) => c.path === path)!;
  const spec = butterSpec(100, channel.sampleRateHz);
  const content = buildRevisionContent(spec, channel.coefficientFormat);
  const input = { spec, content, notes: "", format: channel.coefficientFormat, sampleRateHz: channel.sampleRateHz };
  const saved = await lab.db.transaction().execute((trx) => createSet(trx, users.engineer, channel.id, "moving promotion", input));
  await lab.db.transaction().execute((trx) => transitionRevision(trx, users.engineer, { revisionId: saved.revisionId, action: "submit", expectedVersion: 1 }));
  await lab.db.transaction().execute((trx) =>
    transitionRevision(trx, users.lead, { revisionId: saved.revisionId, action: "approve", expectedVersion: 2, comment: "ok" }),
  );
  return saved.revisionId;
}

beforeAll(async () => {
  lab = await setUpLab("sidecar_leases");
  users = lab.users;
  channels = await listChannels(lab.db);
  broker = await mosquitto(undefined, MQTT_PORT);
  await startDevices();
  for (const id of Object.keys(SIDECAR_PORTS)) await startChild(id);
}, 60_000);

afterAll(async () => {
  clearInterval(publishing);
  for (const child of sidecars.values()) if (child.exitCode === null) child.kill("SIGKILL");
  await device?.endAsync();
  await broker?.stop();
  await lab?.close();
});

describe("channels partitioned across three sidecars on Debian's mosquitto", () => {
  it("gives every channel to exactly one sidecar, which alone filters it", async () => {
    await balanced(Object.keys(SIDECAR_PORTS), 15_000);
    const since = Date.now();
    await new Promise((r) => setTimeout(r, 1500));
    const current = await owners();
    for (const c of channels) {
      const by = new Set(filtered.filter((f) => f.path === c.path && f.at > since + 500).map((f) => f.id));
      expect([...by], c.path).toEqual([current.get(c.path)]);
    }
  }, 30_000);

  it("moves a killed sidecar's channels within 10 s, frames resume, no channel is filtered twice, and a promotion during the move is acknowledged once", async () => {
    const before = await balanced(Object.keys(SIDECAR_PORTS), 15_000);
    const victim = before.get(TORQUE)!;
    const moved = [...before].filter(([, o]) => o === victim).map(([p]) => p);
    const killedAt = Date.now();
    sidecars.get(victim)!.kill("SIGKILL");
    const revisionId = await approvedRevision(TORQUE);
    const promotion = await lab.db.transaction().execute((trx) => requestPromotion(trx, users.lead, revisionId, [TORQUE]));
    const deploymentId = promotion.deployments[0].id;

    const survivors = Object.keys(SIDECAR_PORTS).filter((id) => id !== victim);
    const after = await balanced(survivors, 10_000);
    // Filtering resumed on the new owners within 10 s of the kill.
    for (const path of moved) {
      await until(() => filtered.some((f) => f.path === path && f.id === after.get(path) && f.at > killedAt), 10_000 - (Date.now() - killedAt), `${path} resumed`);
      const resumed = filtered.find((f) => f.path === path && f.id === after.get(path) && f.at > killedAt)!;
      expect(resumed.at - killedAt, path).toBeLessThan(10_000);
    }

    // The promotion went out once and was acknowledged once; the new owner runs it as production.
    const channel = channels.find((c) => c.path === TORQUE)!;
    for (let i = 0; i < 100 && (await findActiveDeployment(lab.db, channel.id))?.id !== deploymentId; i++) await new Promise((r) => setTimeout(r, 100));
    expect((await findActiveDeployment(lab.db, channel.id))?.id).toBe(deploymentId);
    const configIds = [...acks.keys()].filter((k) => k === String(deploymentId));
    expect(configIds.map((k) => acks.get(k))).toEqual([1]);
    await until(() => filtered.some((f) => f.path === TORQUE && f.production === String(revisionId)), 5000, "the promoted filter at the new owner");

    // No batch of any channel was filtered by two sidecars.
    for (const c of channels) {
      const seen = new Map<number, string>();
      for (const f of filtered.filter((x) => x.path === c.path)) {
        const other = seen.get(f.seq);
        expect(other === undefined || other === f.id, `${c.path} seq ${f.seq} filtered by ${other} and ${f.id}`).toBe(true);
        seen.set(f.seq, f.id);
      }
    }

    // A browser on the new owner gets frames of the moved channel.
    const cookie = await cookieFor(lab.db, "operator@tapwright.test");
    const socket = await openSocket(SIDECAR_PORTS[after.get(TORQUE)!], cookie);
    socket.send({ type: "subscribe", channel: TORQUE });
    expect((await socket.next("frame", (f) => f.channel === TORQUE)).raw.length).toBeGreaterThan(0);
    socket.ws.close();
  }, 60_000);
});
