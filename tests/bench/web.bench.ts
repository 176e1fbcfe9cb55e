/**
 * Web app under load, with autocannon: 50 connections on the main read APIs as a signed-in operator,
 * 15 s of warm-up then three measured rounds of 20 s (p50 and p99 latency and errors per round, the
 * web server's resident memory after the warm-up and after each round), then an engineer
 * posts the largest design the limits allow while /api/health is polled every 25 ms (how long health
 * takes while the design runs on a design thread). Targets: p99 < 100 ms with no errors, memory flat,
 * health within 100 ms. A reference round on /api/health alone shows what the request handling itself
 * allows on the machine. Starts its own web server (server/run/web.ts) on a free port with the
 * environment tests/bench/run.sh exports. Run: node --import tsx tests/bench/web.bench.ts
 */
import { spawn } from "node:child_process";
import { readFileSync } from "node:fs";
import net from "node:net";
import autocannon from "autocannon";

const PASSWORD = process.env.DEMO_PASSWORD ?? "tapwright-demo";
const CONNECTIONS = 50;
const SECONDS = 20;
const WARM_SECONDS = 15;
const ROUNDS = 3;
const CHANNEL = "gearbox-endurance/torque-node/input-torque";
const READS = ["/api/v1/channels", "/api/v1/sets?pageSize=20", `/api/v1/deployments?channel=${CHANNEL}`, "/api/auth/me", "/api/v1/recordings"];

/** Two 1,023-tap FIR stages: 2,046 taps and order 2,044, at the limits (SPEC_LIMITS.maxTotalTaps, maxTotalOrder). */
const fir = { kind: "fir", response: "lowpass", window: "hamming", taps: 1023, sampleRateHz: 1000 };
const LARGEST = { kind: "chain", sampleRateHz: 1000, stages: [{ ...fir, cutoffHz: 100 }, { ...fir, cutoffHz: 120 }] };

function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const s = net.createServer();
    s.once("error", reject);
    s.listen(0, "127.0.0.1", () => {
      const { port } = s.address() as net.AddressInfo;
      s.close(() => resolve(port));
    });
  });
}

const residentMb = (pid: number) => Number(/VmRSS:\s+(\d+)/.exec(readFileSync(`/proc/${pid}/status`, "utf8"))?.[1] ?? 0) / 1024;
const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

const port = await freePort();
const base = `http://127.0.0.1:${port}`;
const server = spawn("node", ["--import", "tsx", "server/run/web.ts"], { stdio: "ignore", env: { ...process.env, NODE_ENV: "production", HOST: "127.0.0.1", PORT: String(port) } });
try {
  let up = false;
  for (let i = 0; i < 240 && !up; i++) {
    await sleep(250);
    up = await fetch(`${base}/api/health`).then((r) => r.ok, () => false);
  }
  if (!up) throw new Error(`the web server did not answer on ${base} (is the app built? run tests/bench/run.sh)`);

  async function signIn(role: string): Promise<string> {
    const res = await fetch(`${base}/api/auth/login`, {
      method: "POST",
      headers: { "content-type": "application/json", origin: base },
      body: JSON.stringify({ email: `${role}@tapwright.test`, password: PASSWORD }),
    });
    if (!res.ok) throw new Error(`sign-in as ${role} failed: HTTP ${res.status}`);
    return (res.headers.get("set-cookie") ?? "").split(";")[0];
  }

  // Warm up: every route once, then load for WARM_SECONDS, unmeasured (V8 compiles the hot paths and
  // settles its heap; a server that has run for a minute is what users meet).
  const operator = await signIn("operator");
  for (const path of READS) await fetch(`${base}${path}`, { headers: { cookie: operator } });
  const load = (duration: number) =>
    autocannon({ url: base, connections: CONNECTIONS, duration, headers: { cookie: operator }, requests: READS.map((path) => ({ method: "GET" as const, path })) });
  await load(WARM_SECONDS);
  await sleep(1000);
  const rssMb = [Math.round(residentMb(server.pid!))];
  // Then ROUNDS measured rounds; the resident memory after each shows whether it keeps growing.
  for (let round = 1; round <= ROUNDS; round++) {
    const result = await load(SECONDS);
    await sleep(1000);
    rssMb.push(Math.round(residentMb(server.pid!)));
    console.log(
      JSON.stringify({
        bench: "web read APIs under load",
        round,
        connections: CONNECTIONS,
        seconds: SECONDS,
        routes: READS,
        requests: result.requests.total,
        perSecond: result.requests.average,
        p50Ms: result.latency.p50,
        p99Ms: result.latency.p99,
        maxMs: result.latency.max,
        errors: result.errors + result.timeouts + result.non2xx,
        targets: { p99Ms: 100, errors: 0 },
      }),
    );
  }
  console.log(JSON.stringify({ bench: "web server resident memory, MB", afterWarmUpThenEachRound: rssMb, target: "flat after the warm-up" }));

  // Reference in the same run: the same load on /api/health (no session, one `select 1`), the least a
  // request through the web app's request handling can cost on this machine.
  const floor = await autocannon({ url: `${base}/api/health`, connections: CONNECTIONS, duration: SECONDS });
  console.log(
    JSON.stringify({
      bench: "reference: /api/health under the same load",
      connections: CONNECTIONS,
      seconds: SECONDS,
      perSecond: floor.requests.average,
      p50Ms: floor.latency.p50,
      p99Ms: floor.latency.p99,
      errors: floor.errors + floor.timeouts + floor.non2xx,
    }),
  );

  // Health while the largest allowed design is computed (on a design thread, so the event loop stays free).
  const engineer = await signIn("engineer");
  const healthMs: number[] = [];
  let designing = true;
  const poll = (async () => {
    while (designing) {
      const t = performance.now();
      await fetch(`${base}/api/health`);
      healthMs.push(performance.now() - t);
      await sleep(25);
    }
  })();
  const t0 = performance.now();
  const saved = await fetch(`${base}/api/v1/sets`, {
    method: "POST",
    headers: { "content-type": "application/json", origin: base, cookie: engineer },
    body: JSON.stringify({ channel: CHANNEL, name: `Largest design ${Date.now()}`, spec: LARGEST }),
  });
  const designMs = performance.now() - t0;
  designing = false;
  await poll;
  const sorted = [...healthMs].sort((a, b) => a - b);
  console.log(
    JSON.stringify({
      bench: "health while the largest allowed design is posted",
      design: "chain of two 1,023-tap FIR stages (2,046 taps, order 2,044)",
      status: saved.status,
      designMs: Math.round(designMs),
      healthChecks: sorted.length,
      healthP50Ms: Math.round(sorted[Math.floor(sorted.length / 2)] ?? NaN),
      healthMaxMs: Math.round(sorted.at(-1) ?? NaN),
      target: { healthMaxMs: 100 },
    }),
  );
} finally {
  server.kill("SIGTERM");
}
