/**
 * Live pipeline bench: device publish → embedded broker → ingest → filters → WebSocket frame.
 * Run: `node --import tsx tests/bench/pipeline.bench.ts` with TEST_DATABASE_URL or MIGRATION_DATABASE_URL
 * (tests/bench/run.sh exports the latter): a role that may create databases; it creates and drops its own.
 *
 * The sidecar runs in this process (its CPU share comes from process.cpuUsage); devices and the
 * browser-like WebSocket client run in one child process, forked before the sidecar starts, so they
 * are not counted. Each device publishes its eight channels every 20 ms at a phase of its own. Latency
 * is from the publish of a message to the arrival of the frame that carries it, frame interval included.
 * Loopback only; the channel-count search is bounded and stops by itself. Last line: JSON.
 *
 * Then the partitioned set-up: first its floor (the same devices and broker, a bare subscriber per
 * sidecar in its place, floorRun), then CLUSTER_CHANNELS channels held by two sidecars (child
 * processes, their CPU read from /proc) on one Debian mosquitto (BENCH_MQTT_PORT, default 18950), the
 * browser-like client connected to both, each channel on the socket of its owner (from the leases).
 * BENCH_CLUSTER_ONLY=1 runs the partitioned set-up alone.
 */
import { fork, spawn, type ChildProcess } from "node:child_process";
import { readFileSync } from "node:fs";
import { availableParallelism } from "node:os";
import { monitorEventLoopDelay } from "node:perf_hooks";
import { fileURLToPath } from "node:url";
import { sealData } from "iron-session";
import mqtt from "mqtt";
import pg from "pg";
import WebSocket from "ws";
import { createDb, type Db } from "@/db/client";
import { createSession } from "@/db/queries/sessions";
import { hashPassword } from "@/lib/auth/password";
import { SESSION_COOKIE } from "@/lib/auth/session-config";
import { decodeFrames, encodeBinarySamples, samplesTopic, type ServerMessage } from "@/lib/protocol";
import { channelOwners } from "@/db/queries/leases";
import { migrateToLatest } from "@/migrations/migrator";
import { mosquitto } from "../integration/sidecar-support";
import { sharedDesigns } from "../integration/support/shared-designs";
import { startSidecar } from "@/server/sidecar";
import { systemClock } from "@/server/clock";
import { SIDECAR_NODE_FLAGS } from "@/server/run/sidecar-flags";

const FS = 2000;
const BATCH = 40; // 20 ms of samples per message
const BATCH_MS = (BATCH / FS) * 1000;
const CHANNELS_PER_DEVICE = 8;
const CANDIDATES_PER_CHANNEL = 4;
const MAIN_CHANNELS = 64;
const MAIN_SECONDS = 10;
const STEP_SECONDS = 5;
const MAX_CHANNELS = 512; // bound of the search
const STEP = 64;
/** Channels of the partitioned run (two sidecars); BENCH_CLUSTER_CHANNELS runs a smaller one (512 divided by a power of two). */
const CLUSTER_CHANNELS = Number(process.env.BENCH_CLUSTER_CHANNELS ?? 1024);
const CLUSTER_SIDECARS = 2;
/** The partitioned run's sidecars are fresh processes (the single one is warmed by the smaller steps before it). */
const CLUSTER_WARMUP_SECONDS = 5;
/** A step is sustained when p99 latency stays under this and no frame was dropped or lost. */
const P99_LIMIT_MS = 50;
const SECRET = "pipeline-bench-secret-0123456789abcdef0123456789";

const CANDIDATES = [
  { kind: "iir", family: "butterworth", response: "lowpass", order: 4, cutoffHz: 100, sampleRateHz: FS },
  { kind: "biquad", shape: "notch", centerHz: 50, q: 5, sampleRateHz: FS },
  { kind: "fir", response: "lowpass", window: "hamming", taps: 31, cutoffHz: 200, sampleRateHz: FS },
  { kind: "moving-average", length: 8, sampleRateHz: FS },
];

interface LoadJob {
  mqttUrl: string;
  /** One WebSocket per sidecar, with the channels it holds; no socket where wsUrl is null (the floor run's bare subscribers). */
  targets: Array<{ wsUrl: string | null; paths: string[] }>;
  cookie: string;
  seconds: number;
  /** Load before the measured window: the sidecars' code warms up and any start-up backlog drains. */
  warmupSeconds: number;
}

interface LoadResult {
  published: number;
  publishedSamples: number;
  receivedSamples: number;
  latenciesMs: number[];
  droppedFrames: number;
  /** CPU share of the load process (devices + WebSocket client) over the measured window. */
  loadCpuShare: number;
}

function quantile(sorted: number[], q: number): number {
  if (!sorted.length) return Number.NaN;
  return sorted[Math.min(sorted.length - 1, Math.floor(q * sorted.length))];
}

/** One engineer's WebSocket to a sidecar with candidates on each of its channels; resolves once all are added. */
async function openLoadSocket(
  target: { wsUrl: string; paths: string[] },
  cookie: string,
  onMessage: (m: ServerMessage) => void,
): Promise<WebSocket> {
  const ws = new WebSocket(target.wsUrl, { headers: { cookie } });
  let barrier: (() => void) | undefined;
  ws.on("message", (data, isBinary) => {
    if (isBinary) {
      const decoded = decodeFrames(new Uint8Array(data as Buffer));
      if (!decoded.ok) throw new Error(`bad frame: ${decoded.reason}`);
      for (const frame of decoded.frames) onMessage(frame);
      return;
    }
    const m = JSON.parse(data.toString()) as ServerMessage;
    if (m.type === "error" && m.code === "unknown_channel") barrier?.();
    else onMessage(m);
  });
  await new Promise<void>((resolve, reject) => {
    ws.once("open", () => resolve());
    ws.once("error", reject);
  });
  for (const channel of target.paths) {
    ws.send(JSON.stringify({ type: "subscribe", channel }));
    CANDIDATES.forEach((spec, i) => ws.send(JSON.stringify({ type: "candidate.add", channel, id: `k${i}`, spec })));
  }
  await new Promise<void>((resolve) => {
    barrier = resolve;
    ws.send(JSON.stringify({ type: "subscribe", channel: "no/such/channel" }));
  });
  return ws;
}

/**
 * Child process: devices publishing binary batches and one engineer's WebSocket per sidecar with
 * candidates on every channel. Each device publishes its channels' batches every BATCH_MS at its own
 * phase, spread evenly over the period, as independent devices do (not every device in the same instant).
 */
async function runLoad(job: LoadJob): Promise<LoadResult> {
  const paths = job.targets.flatMap((t) => t.paths);
  const n = paths.length;
  const indexOf = new Map(paths.map((p, i) => [p, i]));
  /** Publish time of every (seq, channel) of the run, NaN until published. */
  const seqs = Math.ceil(((job.warmupSeconds + job.seconds + 3) * 1000) / BATCH_MS);
  const sentAt = new Float64Array(seqs * n).fill(Number.NaN);
  const latencies: number[] = [];
  let receivedSamples = 0;
  const dropped = new Map<number, number>();
  /** Sequence numbers published inside the measured window. */
  const window = { first: Infinity, last: Infinity };
  /** Frames and status from sidecar k's socket. */
  const heard = (k: number) => (m: ServerMessage) => {
    if (m.type === "frame") {
      const t = m.seq < seqs ? sentAt[m.seq * n + (indexOf.get(m.channel) ?? Number.NaN)] : Number.NaN;
      if (m.seq >= window.first && m.seq <= window.last && !Number.isNaN(t)) {
        latencies.push(performance.now() - t);
        receivedSamples += m.samples;
      }
    } else if (m.type === "status") {
      dropped.set(k, Math.max(dropped.get(k) ?? 0, m.droppedFrames));
    }
  };
  const sockets = await Promise.all(
    job.targets.flatMap(({ wsUrl, paths }, k) => (wsUrl === null ? [] : [openLoadSocket({ wsUrl, paths }, job.cookie, heard(k))])),
  );
  /** Each device's channels (indexes into paths), devices in order of first appearance. */
  const byDevice = new Map<string, number[]>();
  paths.forEach((p, c) => {
    const device = p.split("/").slice(0, 2).join("/");
    byDevice.set(device, [...(byDevice.get(device) ?? []), c]);
  });
  const channelsOf = [...byDevice.values()];
  const clients = await Promise.all(channelsOf.map(() => mqtt.connectAsync(job.mqttUrl, { reconnectPeriod: 0 })));
  const topics = paths.map(samplesTopic);
  const values = Float64Array.from({ length: BATCH }, (_, i) => Math.sin((2 * Math.PI * 50 * i) / FS) + 0.1 * Math.cos(i));
  /** Device rounds made (seq × devices + device): device d's seq s is due at (s + d / devices) × BATCH_MS after the start. */
  let made = 0;
  let payload = { seq: -1, bytes: Buffer.alloc(0) };
  const started = performance.now();
  const timer = setInterval(() => {
    const due = Math.min(seqs * channelsOf.length, Math.floor(((performance.now() - started) * channelsOf.length) / BATCH_MS));
    for (; made < due; made++) {
      const seq = Math.floor(made / channelsOf.length);
      const d = made % channelsOf.length;
      if (payload.seq !== seq) payload = { seq, bytes: Buffer.from(encodeBinarySamples({ seq, t0: seq * BATCH_MS, sampleRateHz: FS, values })) };
      for (const c of channelsOf[d]) {
        sentAt[seq * n + c] = performance.now();
        clients[d].publish(topics[c], payload.bytes);
      }
    }
  }, 1);
  const currentSeq = () => Math.floor(made / channelsOf.length);
  await new Promise((r) => setTimeout(r, job.warmupSeconds * 1000));
  window.first = currentSeq() + 1;
  process.send?.({ type: "measuring" });
  const cpu = process.cpuUsage();
  await new Promise((r) => setTimeout(r, job.seconds * 1000));
  const used = process.cpuUsage(cpu);
  const loadCpuShare = (used.user + used.system) / 1000 / (job.seconds * 1000);
  window.last = currentSeq() - 1;
  process.send?.({ type: "stopped" });
  await new Promise((r) => setTimeout(r, 1000)); // let the last frames arrive
  clearInterval(timer);
  for (const ws of sockets) ws.close();
  // Forced: an overloaded run may hold a backlog of QoS 0 publishes that would otherwise be flushed first.
  await Promise.all(clients.map((c) => c.endAsync(true)));
  const droppedFrames = [...dropped.values()].reduce((a, b) => a + b, 0);
  const published = Math.max(0, window.last - window.first + 1) * n;
  return { published, publishedSamples: published * BATCH, receivedSamples, latenciesMs: latencies, droppedFrames, loadCpuShare };
}

/** CPU time (ms) this process has used: the in-process sidecar's. */
const ownCpuMs = (): number => {
  const u = process.cpuUsage();
  return (u.user + u.system) / 1000;
};

/** CPU time (ms) of child processes from /proc/<pid>/stat (utime + stime, fields 14 and 15, in ticks of 10 ms: CLK_TCK 100). */
const childrenCpuMs = (pids: number[]) => (): number =>
  pids.reduce((sum, pid) => {
    const fields = readFileSync(`/proc/${pid}/stat`, "utf8").replace(/^.*\) /, "").split(" ");
    return sum + (Number(fields[11]) + Number(fields[12])) * 10;
  }, 0);

type LoadEvent = { type: "measuring" } | { type: "stopped" } | { type: "result"; result: LoadResult };

/**
 * The load process, forked once before any sidecar starts in this process: a fork write-protects
 * every page of the parent, so each page the parent writes afterwards takes a fault (about 13 µs in
 * this VM; a minute of ring history is 240 pages a channel). A sidecar never forks; forking a load
 * per run after the sidecar is up made its ring writes cost 25 times as much.
 */
function startLoadProcess() {
  const child = fork(fileURLToPath(import.meta.url), ["--load"], { execArgv: ["--import", "tsx"], stdio: ["ignore", "inherit", "inherit", "ipc"] });
  let listener: ((m: LoadEvent) => void) | null = null;
  let failed: ((err: Error) => void) | null = null;
  child.on("message", (m: LoadEvent) => listener?.(m));
  child.on("error", (err) => failed?.(err));
  child.on("exit", (code) => failed?.(new Error(`load process exited with ${code}`)));
  return {
    /** Runs one job; `onEvent` hears when the measured window opens and closes. */
    run(job: LoadJob, onEvent: (m: LoadEvent) => void): Promise<LoadResult> {
      return new Promise((resolve, reject) => {
        failed = reject;
        listener = (m) => {
          onEvent(m);
          if (m.type === "result") resolve(m.result);
        };
        child.send(job);
      });
    },
    stop(): void {
      failed = null;
      child.kill("SIGKILL");
    },
  };
}

type LoadProcess = ReturnType<typeof startLoadProcess>;

/**
 * CPU shares over the load's measured window: each meter reads a CPU time in ms, and a share is
 * its growth over the window's wall time (1 = one core busy).
 */
function windowShares<K extends string>(meters: Record<K, () => number>) {
  const keys = Object.keys(meters) as K[];
  const read = () => Object.fromEntries(keys.map((k) => [k, meters[k]()])) as Record<K, number>;
  let start = { at: performance.now(), cpu: read() };
  let shares: Record<K, number> | null = null;
  return {
    open(): void {
      start = { at: performance.now(), cpu: read() };
    },
    close(): void {
      const wall = performance.now() - start.at;
      const cpu = read();
      shares = Object.fromEntries(keys.map((k) => [k, Number(((cpu[k] - start.cpu[k]) / wall).toFixed(3))])) as Record<K, number>;
    },
    get shares(): Record<K, number> {
      if (!shares) throw new Error("the measured window did not close");
      return shares;
    },
  };
}

/**
 * One measured run; `cpuMs` reads the sidecars' CPU time (this process's when the sidecar runs here,
 * then its event loop delay is read too), `brokerCpuMs` an external broker's.
 */
async function step(load: LoadProcess, job: LoadJob, cpuMs: () => number = ownCpuMs, brokerCpuMs?: () => number) {
  const meter = windowShares({ sidecars: cpuMs, broker: brokerCpuMs ?? (() => Number.NaN) });
  const loopDelay = monitorEventLoopDelay({ resolution: 5 });
  const result = await load.run(job, (m) => {
    if (m.type === "measuring") {
      meter.open();
      loopDelay.enable();
    } else if (m.type === "stopped") {
      meter.close();
      loopDelay.disable();
    }
  });
  const cpuShare = meter.shares.sidecars;
  const sorted = [...result.latenciesMs].sort((a, b) => a - b);
  const coverage = result.publishedSamples ? result.receivedSamples / result.publishedSamples : 0;
  const p99 = quantile(sorted, 0.99);
  return {
    channels: job.targets.reduce((n, t) => n + t.paths.length, 0),
    messagesPerSecond: Math.round(result.published / job.seconds),
    p50Ms: Number(quantile(sorted, 0.5).toFixed(2)),
    p99Ms: Number(p99.toFixed(2)),
    sidecarCpuShare: cpuShare,
    sidecarCpuPerChannel: Number((cpuShare / job.targets.reduce((n, t) => n + t.paths.length, 0)).toFixed(5)),
    sidecarLoopDelayP99Ms: cpuMs === ownCpuMs ? Number((loopDelay.percentile(99) / 1e6).toFixed(1)) : null,
    loadCpuShare: Number(result.loadCpuShare.toFixed(3)),
    brokerCpuShare: brokerCpuMs ? meter.shares.broker : null,
    droppedFrames: result.droppedFrames,
    sampleCoverage: Number(coverage.toFixed(4)),
    sustained: p99 < P99_LIMIT_MS && result.droppedFrames === 0 && coverage > 0.99,
  };
}

/** A partitioned sidecar as its own process (the lease tests' runner, in bench mode); resolves when it serves. */
function startLeaseSidecar(dbUrl: string, mqttUrl: string, id: string, port: number): Promise<ChildProcess> {
  const entry = fileURLToPath(new URL("../integration/support/lease-sidecar.ts", import.meta.url));
  const child = fork(entry, [dbUrl, mqttUrl, id, String(port), SECRET, "bench"], { execArgv: [...SIDECAR_NODE_FLAGS, "--import", "tsx"], stdio: ["ignore", "inherit", "inherit", "ipc"] });
  return new Promise((resolve, reject) => {
    child.on("message", (m: { type: string; id?: string; m?: string }) => {
      if (m.type === "ready") resolve(child);
      // The sidecars' own log lines (lease moves, stopped channels) beside the figures they explain.
      else if (m.type === "log") console.error(`[sidecar ${m.id}] ${m.m}`);
    });
    child.once("exit", (code) => reject(new Error(`sidecar ${id} exited with ${code}`)));
  });
}

/** The partitioned run's CLUSTER_CHANNELS channels: every stride-th, so a smaller run still spreads over both halves of the lab. */
function clusterPaths(paths: string[]): string[] {
  const stride = Math.max(1, Math.floor(paths.length / CLUSTER_CHANNELS));
  return paths.filter((_, i) => i % stride === 0);
}

/** A bare subscriber process (bare-subscriber.ts) holding the sample topics of `paths`; resolves once subscribed. */
async function startBareSubscriber(mqttUrl: string, paths: string[]) {
  const entry = fileURLToPath(new URL("./bare-subscriber.ts", import.meta.url));
  const child = fork(entry, [mqttUrl], { execArgv: ["--import", "tsx"], stdio: ["ignore", "inherit", "inherit", "ipc"] });
  const reply = <T>(type: string) =>
    new Promise<T>((resolve, reject) => {
      const onExit = (code: number | null) => reject(new Error(`bare subscriber exited with ${code}`));
      const onMessage = (m: { type: string } & T) => {
        if (m.type !== type) return;
        child.off("message", onMessage);
        child.off("exit", onExit);
        resolve(m);
      };
      child.on("message", onMessage);
      child.once("exit", onExit);
    });
  const ready = reply<object>("ready");
  child.send({ type: "subscribe", paths });
  await ready;
  return {
    pid: child.pid ?? 0,
    mark: () => child.send({ type: "mark" }),
    /** Messages received between the two marks. */
    async report(): Promise<number> {
      const answer = reply<{ messages: number }>("report");
      child.send({ type: "report" });
      return (await answer).messages;
    },
    stop: () => child.kill("SIGKILL"),
  };
}

/**
 * The machine's floor under the partitioned run: the same devices and Debian mosquitto at
 * CLUSTER_CHANNELS channels, with one bare subscriber per sidecar in its place (mqtt.js receiving
 * and counting, no filtering, no frames). What broker, load and bare subscribers take of the cores
 * no sidecar can have; a message the broker does not deliver here no sidecar gets either.
 * Subscribers mark the window when the load reports it, so the delivered share is good to a frame's
 * worth of messages at either end (about 0.2 % of a 10 s window).
 */
async function floorRun(load: LoadProcess, paths: string[]) {
  const broker = await mosquitto(undefined, Number(process.env.BENCH_MQTT_PORT ?? 18950));
  const chosen = clusterPaths(paths);
  const share = chosen.length / CLUSTER_SIDECARS;
  const parts = Array.from({ length: CLUSTER_SIDECARS }, (_, i) => chosen.slice(i * share, (i + 1) * share));
  const subscribers = await Promise.all(parts.map((part) => startBareSubscriber(broker.url, part)));
  try {
    const meter = windowShares({ broker: childrenCpuMs([broker.pid() ?? 0]), subscribers: childrenCpuMs(subscribers.map((s) => s.pid)) });
    const job = { mqttUrl: broker.url, targets: parts.map((part) => ({ wsUrl: null, paths: part })), cookie: "", seconds: MAIN_SECONDS, warmupSeconds: CLUSTER_WARMUP_SECONDS };
    const result = await load.run(job, (m) => {
      if (m.type === "result") return;
      for (const s of subscribers) s.mark();
      if (m.type === "measuring") meter.open();
      else meter.close();
    });
    const delivered = (await Promise.all(subscribers.map((s) => s.report()))).reduce((a, b) => a + b, 0);
    const { broker: brokerCpuShare, subscribers: subscribersCpuShare } = meter.shares;
    const floorCpuShare = Number((brokerCpuShare + subscribersCpuShare + result.loadCpuShare).toFixed(3));
    return {
      channels: chosen.length,
      messagesPerSecond: Math.round(result.published / MAIN_SECONDS),
      deliveredShare: Number((delivered / result.published).toFixed(4)),
      brokerCpuShare,
      loadCpuShare: Number(result.loadCpuShare.toFixed(3)),
      subscribersCpuShare,
      floorCpuShare,
      cores: availableParallelism(),
      coresLeftForSidecars: Number((availableParallelism() - floorCpuShare).toFixed(3)),
    };
  } finally {
    for (const s of subscribers) s.stop();
    await broker.stop();
  }
}

/** CLUSTER_CHANNELS channels on CLUSTER_SIDECARS sidecars sharing one Debian mosquitto, once the leases are balanced. */
async function clusterRun(load: LoadProcess, db: Db, dbUrl: string, cookie: string, paths: string[]) {
  const broker = await mosquitto(undefined, Number(process.env.BENCH_MQTT_PORT ?? 18950));
  const basePort = Number(process.env.BENCH_SIDECAR_PORT ?? 3350);
  const ids = Array.from({ length: CLUSTER_SIDECARS }, (_, i) => `bench-${i}`);
  const children: ChildProcess[] = [];
  try {
    for (const [i, id] of ids.entries()) children.push(await startLeaseSidecar(dbUrl, broker.url, id, basePort + i));
    const share = paths.length / CLUSTER_SIDECARS;
    const chosen = clusterPaths(paths);
    const end = Date.now() + 60_000;
    let owners = await channelOwners(db);
    while (owners.size < paths.length || ids.some((id) => [...owners.values()].filter((o) => o.sidecarId === id).length !== share)) {
      if (Date.now() > end) throw new Error("the leases did not balance within 60 s");
      await new Promise((r) => setTimeout(r, 200));
      owners = await channelOwners(db);
    }
    const targets = ids.map((id, i) => ({
      wsUrl: `ws://127.0.0.1:${basePort + i}/ws`,
      paths: chosen.filter((path) => owners.get(path)?.sidecarId === id),
    }));
    return await step(load, { mqttUrl: broker.url, targets, cookie, seconds: MAIN_SECONDS, warmupSeconds: CLUSTER_WARMUP_SECONDS }, childrenCpuMs(children.map((c) => c.pid ?? 0)), childrenCpuMs([broker.pid() ?? 0]));
  } finally {
    for (const child of children) child.kill("SIGKILL");
    await broker.stop();
  }
}

async function main(): Promise<void> {
  const base = process.env.TEST_DATABASE_URL ?? process.env.MIGRATION_DATABASE_URL;
  if (!base) throw new Error("set TEST_DATABASE_URL or MIGRATION_DATABASE_URL to a PostgreSQL role that may create databases");
  // First, before this process holds a sidecar (startLoadProcess says why).
  const load = startLoadProcess();
  try {
    await measure(load, base);
  } finally {
    load.stop();
  }
}

async function measure(load: LoadProcess, base: string): Promise<void> {
  const name = `tw_pipeline_bench_${process.pid}`;
  const admin = new pg.Client({ connectionString: base });
  await admin.connect();
  await admin.query(`create database "${name}"`);
  const url = new URL(base);
  url.pathname = `/${name}`;
  const db = createDb(url.toString(), 4);
  try {
    await migrateToLatest(db);
    const rig = await db.insertInto("rigs").values({ key: "bench", name: "Bench rig" }).returning("id").executeTakeFirstOrThrow();
    const paths: string[] = [];
    for (let d = 0; d < Math.max(CLUSTER_CHANNELS, MAX_CHANNELS) / CHANNELS_PER_DEVICE; d++) {
      const key = `node-${String(d).padStart(3, "0")}`;
      const dev = await db.insertInto("devices").values({ rig_id: rig.id, key, name: key }).returning("id").executeTakeFirstOrThrow();
      const rows = Array.from({ length: CHANNELS_PER_DEVICE }, (_, c) => ({
        device_id: dev.id, key: `ch-${c}`, name: `ch ${c}`, unit: "V", sample_rate_hz: FS, range_min: -10, range_max: 10,
      }));
      await db.insertInto("channels").values(rows).execute();
      paths.push(...rows.map((r) => `bench/${key}/${r.key}`));
    }
    const user = await db.insertInto("users")
      .values({ email: "bench@tapwright.test", display_name: "Bench Engineer", password_hash: await hashPassword("bench-password"), role: "engineer" })
      .returning(["id", "session_version"]).executeTakeFirstOrThrow();
    const sessionId = await createSession(db, user.id, 3600);
    const cookie = `${SESSION_COOKIE}=${await sealData({ userId: user.id, sessionVersion: user.session_version, sessionId }, { password: SECRET, ttl: 3600 })}`;
    if (process.env.BENCH_CLUSTER_ONLY !== "1") {
      const quiet = { info: () => undefined, warn: (m: string) => console.error(m) };
      const sidecar = await startSidecar({
        db, clock: systemClock, logger: quiet, sessionSecret: SECRET, sessionTtlSeconds: 3600,
        http: { host: "127.0.0.1", port: 0 },
        mqtt: { mode: "embedded", host: "127.0.0.1", port: 0, requireDeviceAuth: false },
        republishFiltered: false,
        // The bench measures the stream, not design: one client adds every candidate at once, designed in-process.
        design: sharedDesigns(),
        ws: { messageRate: { perSecond: 1e6, burst: 1e6 } },
      });
      try {
        const job = (n: number, seconds: number): LoadJob => ({
          mqttUrl: sidecar.mqttUrl,
          targets: [{ wsUrl: `ws://127.0.0.1:${sidecar.httpPort}/ws`, paths: paths.slice(0, n) }],
          cookie,
          seconds,
          warmupSeconds: 1,
        });
        const main = await step(load, job(MAIN_CHANNELS, MAIN_SECONDS));
        console.log(`${MAIN_CHANNELS} channels × ${FS} Hz × ${CANDIDATES_PER_CHANNEL} candidates:`, main);
        let largestSustained = main.sustained ? MAIN_CHANNELS : 0;
        const search = [];
        for (let n = MAIN_CHANNELS + STEP; main.sustained && n <= MAX_CHANNELS; n += STEP) {
          const r = await step(load, job(n, STEP_SECONDS));
          console.log(`${n} channels:`, r);
          search.push(r);
          if (!r.sustained) break;
          largestSustained = n;
        }
        console.log(JSON.stringify({
          bench: "pipeline",
          sampleRateHz: FS,
          candidatesPerChannel: CANDIDATES_PER_CHANNEL,
          channels: MAIN_CHANNELS,
          p50Ms: main.p50Ms,
          p99Ms: main.p99Ms,
          sidecarCpuShare: main.sidecarCpuShare,
          sidecarLoopDelayP99Ms: main.sidecarLoopDelayP99Ms,
          loadCpuShare: main.loadCpuShare,
          droppedFrames: main.droppedFrames,
          sampleCoverage: main.sampleCoverage,
          largestSustainedChannels: largestSustained,
          searchBound: MAX_CHANNELS,
          search,
        }));
      } finally {
        await sidecar.close();
      }
    }
    const floor = await floorRun(load, paths);
    console.log(`Floor of ${CLUSTER_CHANNELS} channels: mosquitto, devices and bare subscribers without sidecars:`, floor);
    console.log(JSON.stringify({ bench: "pipeline-floor", ...floor }));
    const cluster = await clusterRun(load, db, url.toString(), cookie, paths);
    console.log(`${CLUSTER_CHANNELS} channels on ${CLUSTER_SIDECARS} sidecars and mosquitto:`, cluster);
    console.log(JSON.stringify({ bench: "pipeline-cluster", sidecars: CLUSTER_SIDECARS, target: { channels: CLUSTER_CHANNELS, p99Ms: P99_LIMIT_MS }, ...cluster }));
  } finally {
    await db.destroy();
    await admin.query(`drop database if exists "${name}" with (force)`);
    await admin.end();
  }
}

if (process.argv.includes("--load")) {
  // Jobs come one at a time (each waits for the last result); the process ends with its parent.
  process.on("message", (job: LoadJob) => {
    runLoad(job).then(
      (result) => process.send?.({ type: "result", result }),
      (err: unknown) => {
        console.error(err);
        process.exit(1);
      },
    );
  });
  process.on("disconnect", () => process.exit(0));
} else if (!SIDECAR_NODE_FLAGS.every((flag) => process.execArgv.includes(flag))) {
  // The single sidecar runs in this process: run it with the Node flags npm start gives the sidecar.
  const again = spawn(process.execPath, [...SIDECAR_NODE_FLAGS, ...process.execArgv, fileURLToPath(import.meta.url)], { stdio: "inherit" });
  again.on("exit", (code) => process.exit(code ?? 1));
} else {
  await main();
}
