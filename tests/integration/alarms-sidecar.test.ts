import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createDb, type Db } from "@/db/client";
import { acknowledgeAlarmEvent, listAlarmEvents } from "@/db/queries/alarm-events";
import { findChannelByPath } from "@/db/queries/channels";
import { createSet } from "@/db/workflow/sets";
import { findUserByEmail } from "@/db/queries/users";
import { seedDemo } from "@/db/seed";
import { buildRevisionContent } from "@/lib/coefficients";
import { DEMO_RIGS } from "@/lib/demo/lab";
import { designFilter, type FilterSpec } from "@/lib/dsp";
import type { AlarmEventView } from "@/lib/protocol";
import { migrateToLatest } from "@/migrations/migrator";
import { startAlarms, type AlarmService } from "@/server/alarms/service";
import { systemClock } from "@/server/clock";
import { startDemoRig, type DemoRigHandle } from "@/server/demo-rig/rig";
import type { Sidecar } from "@/server/sidecar";
import { tickingClock } from "../support/ticking-clock";
import { cookieFor, memoryLogger, openSocket, testSidecar, until, type TestSocket } from "./sidecar-support";
import { ownCluster, postgresBin, type OwnCluster } from "./support/own-cluster";

const PATH = "hydraulic-press/supply-node/supply-pressure";
const bin = postgresBin();

/** The notch + low-pass chain that hides the demo's 3 ms spikes but not its excursions. */
const chainSpec: FilterSpec = {
  kind: "chain",
  sampleRateHz: 1000,
  stages: [
    { kind: "biquad", shape: "notch", centerHz: 12, q: 2, sampleRateHz: 1000 },
    { kind: "iir", family: "butterworth", response: "lowpass", order: 2, cutoffHz: 25, sampleRateHz: 1000 },
  ],
};

let cluster: OwnCluster;
let db: Db;
let sidecar: Sidecar;
let alarms: AlarmService;
let rig: DemoRigHandle;
let browser: TestSocket;
let revisionId: number;
const logger = memoryLogger();
const rigClock = tickingClock(Date.parse("2026-12-03T08:00:00Z"));

/** Every alarm the browser was pushed, newest state per id. */
function pushed(): Map<string, AlarmEventView> {
  const byId = new Map<string, AlarmEventView>();
  for (const m of browser.messages) if (m.type === "alarm") byId.set(m.event.id, m.event);
  return byId;
}

/** Runs the demo rig for `seconds` of its time in 100 ms batches, waiting for ingest to keep up. */
async function runRig(seconds: number, stopWhen: () => boolean = () => false): Promise<void> {
  for (let step = 0; step < seconds * 10; step++) {
    rigClock.advance(100);
    if (step % 20 !== 19) continue;
    await until(() => sidecar.ingest.accepted.messages >= rig.counts.published, 10_000, "ingest to catch up");
    if (stopWhen()) return;
  }
}

const limitEvents = () => [...pushed().values()].filter((e) => e.kind === "limit");

beforeAll(async () => {
  if (!bin) return;
  cluster = await ownCluster(bin);
  db = createDb(cluster.url, 4);
  await migrateToLatest(db);
  await seedDemo(db, "sidecar-test-password");
  const engineer = (await findUserByEmail(db, "engineer@tapwright.test"))!;
  const channel = (await findChannelByPath(db, PATH))!;
  const saved = await db.transaction().execute((trx) =>
    createSet(trx, { id: engineer.id, email: engineer.email, name: engineer.display_name, role: engineer.role }, channel.id, "Supply notch + low-pass", {
      spec: chainSpec,
      content: buildRevisionContent(chainSpec, "f32"),
      notes: "",
      format: "f32",
      sampleRateHz: 1000,
    }),
  );
  revisionId = saved.revisionId;
  sidecar = await testSidecar(db);
  // What the deployment worker does once the revision is active on the channel.
  sidecar.pipeline.setProductionFilter(PATH, String(revisionId), designFilter(chainSpec));
  alarms = await startAlarms({ db, databaseUrl: cluster.url, pipeline: sidecar.pipeline, hub: sidecar.hub, clock: systemClock, logger, retryMs: 100 });
  browser = await openSocket(sidecar.httpPort, await cookieFor(db, "operator@tapwright.test"));
  const press = DEMO_RIGS.find((r) => r.key === "hydraulic-press")!;
  rig = await startDemoRig({
    url: sidecar.mqttUrl,
    clock: rigClock,
    logger,
    seed: 20261201,
    batchMs: 100,
    rigs: [{ ...press, devices: press.devices.filter((d) => d.key === "supply-node") }],
  });
}, 120_000);

afterAll(async () => {
  await rig?.stop();
  browser?.ws.close();
  await alarms?.stop();
  await sidecar?.close();
  await db?.destroy();
  cluster?.remove();
});

describe.skipIf(!bin)("alarms on the demo rig's supply pressure, through a database stop and restart", () => {
  it("raises on the excursion, clears, stores it and pushes it; the hidden spikes are recorded as masked", async () => {
    expect(alarms.engine.ruleCount()).toBe(1);
    await runRig(900, () => limitEvents().some((e) => e.state === "cleared"));
    const [excursion] = limitEvents();
    expect(excursion).toMatchObject({ ruleName: "Supply pressure high", channel: PATH, kind: "limit", side: "high", limit: 240, state: "cleared", revisionId });
    expect(excursion.peak).toBeGreaterThan(240);
    expect(Date.parse(excursion.clearedAt!) - Date.parse(excursion.raisedAt)).toBeGreaterThan(2000);
    await until(() => alarms.store.stats().buffered === 0, 5000, "events written");
    const stored = await listAlarmEvents(db, { channelId: (await findChannelByPath(db, PATH))!.id, limit: 500 });
    expect(stored.find((e) => e.id === excursion.id)).toEqual(excursion);
    const masked = [...pushed().values()].filter((e) => e.kind === "masked");
    expect(masked.length).toBeGreaterThan(0);
    for (const m of masked) {
      expect(m.peak).toBeGreaterThan(260); // the 80 bar spike on top of about 200 bar
      expect(stored.find((e) => e.id === m.id)).toMatchObject({ kind: "masked", revisionId, state: m.state });
    }
  }, 120_000);

  it("keeps evaluating while the database is stopped, pushes what it raises, and stores it all once the database is back", async () => {
    const before = new Set(pushed().keys());
    const accepted = sidecar.ingest.accepted.messages;
    cluster.stop();
    await runRig(900, () => limitEvents().filter((e) => !before.has(e.id) && e.state === "cleared").length > 0);
    const during = [...pushed().values()].filter((e) => !before.has(e.id));
    expect(during.some((e) => e.kind === "limit" && e.state === "cleared")).toBe(true);
    expect(sidecar.ingest.accepted.messages).toBeGreaterThan(accepted);
    await until(() => alarms.store.stats().buffered > 0, 5000, "events buffered");
    expect(alarms.store.stats().buffered).toBe(during.length);

    cluster.start();
    await until(() => alarms.store.stats().buffered === 0, 30_000, "buffered events written after the restart");
    expect(alarms.store.stats()).toMatchObject({ dropped: 0, rejected: 0 });
    const stored = new Map((await listAlarmEvents(db, { limit: 500 })).map((e) => [e.id, e]));
    for (const e of during) expect(stored.get(e.id)).toEqual(e);
    expect(logger.lines.some((l) => /alarm events not written, keeping \d+ in memory/.test(l))).toBe(true);
    expect(logger.lines.some((l) => /alarm events written again after/.test(l))).toBe(true);
  }, 180_000);

  it("carries a raised alarm on across a restart of the alarm service instead of raising it twice, and keeps its acknowledgement", async () => {
    const before = new Set(pushed().keys());
    const open = () => limitEvents().find((e) => !before.has(e.id) && e.state === "raised");
    await runRig(900, () => open() !== undefined);
    const raised = open()!;
    await alarms.stop();
    alarms = await startAlarms({ db, databaseUrl: cluster.url, pipeline: sidecar.pipeline, hub: sidecar.hub, clock: systemClock, logger, retryMs: 100 });
    expect(logger.lines.at(-1)).toMatch(/1 alarms carried on/);
    // An operator acknowledges it while it is still raised: every browser hears of it, and it stays acknowledged when it clears.
    const operator = (await findUserByEmail(db, "operator@tapwright.test"))!;
    await db.transaction().execute((trx) =>
      acknowledgeAlarmEvent(trx, { id: operator.id, email: operator.email, name: operator.display_name, role: operator.role }, raised.id, "Pump relief checked."),
    );
    await until(() => pushed().get(raised.id)?.acknowledgedBy === "Demo Operator", 5000, "the acknowledgement pushed");
    await runRig(60, () => pushed().get(raised.id)?.state === "cleared");
    expect(pushed().get(raised.id)).toMatchObject({ state: "cleared", acknowledgedBy: "Demo Operator", comment: "Pump relief checked." });
    expect(limitEvents().filter((e) => !before.has(e.id))).toHaveLength(1);
  }, 180_000);
});
