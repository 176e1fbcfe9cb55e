/**
 * Chart speed check: opens /channels/chart-bench (the live panel fed with raw + production + 4
 * candidates at 2 kHz, 10 s window, at the live frame rate) in headless Chromium and counts animation
 * frames over about 5 s. Target ≥ 50 fps. No sidecar is needed. With BENCH_BASE_URL it uses that web
 * server; otherwise it starts the production build itself (`next start` on BENCH_WEB_PORT, default
 * 3190, with the DATABASE_URL and SESSION_SECRET of the environment, as tests/bench/run.sh exports).
 * Run: node --import tsx tests/bench/chart.bench.ts
 */
import { spawn, type ChildProcess } from "node:child_process";
import { chromium } from "playwright-core";

const PASSWORD = process.env.DEMO_PASSWORD ?? "tapwright-demo";
const MEASURE_MS = 5000;
const TARGET_FPS = 50;

async function startWebServer(): Promise<{ base: string; server: ChildProcess | null }> {
  if (process.env.BENCH_BASE_URL) return { base: process.env.BENCH_BASE_URL, server: null };
  const port = Number(process.env.BENCH_WEB_PORT ?? 3190);
  const base = `http://127.0.0.1:${port}`;
  const server = spawn("node_modules/.bin/next", ["start", "-H", "127.0.0.1", "-p", String(port)], { stdio: "ignore", env: process.env });
  for (let i = 0; i < 120; i++) {
    await new Promise((r) => setTimeout(r, 500));
    const up = await fetch(`${base}/api/health`).then((r) => r.ok, () => false);
    if (up) return { base, server };
  }
  server.kill();
  throw new Error(`the web server did not answer on ${base} within 60 s (is the app built? run tests/bench/run.sh)`);
}

const { base: BASE, server } = await startWebServer();
const browser = await chromium.launch({ executablePath: "/usr/bin/chromium" });
try {
  const context = await browser.newContext({ viewport: { width: 1600, height: 900 } });
  const login = await context.request.post(`${BASE}/api/auth/login`, { data: { email: "admin@tapwright.test", password: PASSWORD }, headers: { origin: BASE } });
  if (!login.ok()) throw new Error(`sign-in failed: HTTP ${login.status()}`);
  const page = await context.newPage();
  await page.goto(`${BASE}/channels/chart-bench`);
  await page.getByTestId("live-chart").locator("canvas").waitFor();
  // Let the 10 s window fill with 20 000 samples per trace before measuring.
  await page.waitForTimeout(10_500);
  // Plain JavaScript text, so that the TypeScript loader's helpers never reach the page.
  const measure = `new Promise((resolve) => {
    const times = [];
    const start = performance.now();
    const step = (t) => {
      times.push(t);
      if (t - start < ${MEASURE_MS}) return requestAnimationFrame(step);
      const gaps = times.slice(1).map((v, i) => v - times[i]);
      resolve({ frames: times.length - 1, elapsedMs: times[times.length - 1] - times[0], worstFrameMs: Math.max(...gaps), slowFrames: gaps.filter((g) => g > 1000 / 30).length });
    };
    requestAnimationFrame(step);
  })`;
  const result = (await page.evaluate(measure)) as { frames: number; elapsedMs: number; worstFrameMs: number; slowFrames: number };
  const points = await page.getByTestId("live-readout").getAttribute("data-frames");
  const fps = (result.frames * 1000) / result.elapsedMs;
  console.log(`chart bench: ${fps.toFixed(1)} fps over ${(result.elapsedMs / 1000).toFixed(1)} s (target ≥ ${TARGET_FPS}); worst frame ${result.worstFrameMs.toFixed(1)} ms, ${result.slowFrames} frames over 33 ms`);
  console.log(
    JSON.stringify({
      bench: "chart",
      traces: 6,
      sampleRateHz: 2000,
      windowSeconds: 10,
      fps: Number(fps.toFixed(1)),
      worstFrameMs: Number(result.worstFrameMs.toFixed(1)),
      slowFrames: result.slowFrames,
      feedFrames: Number(points),
      pass: fps >= TARGET_FPS,
    }),
  );
  process.exitCode = fps >= TARGET_FPS ? 0 : 1;
} finally {
  await browser.close();
  server?.kill();
}
