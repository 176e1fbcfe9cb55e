import { existsSync } from "node:fs";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { supervise, type Supervisor } from "@/server/run/supervisor";
import { freePort, SECRET, seededDb } from "./sidecar-support";

const node = process.execPath;

async function status(url: string): Promise<number> {
  try {
    const res = await fetch(url, { signal: AbortSignal.timeout(2000) });
    return res.status;
  } catch {
    return 0;
  }
}

async function waitFor(what: string, timeoutMs: number, cond: () => Promise<boolean>): Promise<number> {
  const start = Date.now();
  while (Date.now() - start < timeoutMs) {
    if (await cond()) return Date.now() - start;
    await new Promise((r) => setTimeout(r, 100));
  }
  throw new Error(`${what} not within ${timeoutMs / 1000} s`);
}

describe("the supervisor restarts a child that dies", () => {
  it("restarts with a growing back-off and logs why", async () => {
    const lines: string[] = [];
    const s = supervise([{ name: "short", command: node, args: ["-e", "process.exit(3)"] }], {
      initialDelayMs: 50,
      maxDelayMs: 400,
      log: (l) => lines.push(l),
    });
    await waitFor("three restarts", 5000, async () => s.restarts("short") >= 3);
    await s.stop();
    expect(lines[0]).toMatch(/^short exited with code 3 after \d+\.\d s; restarting in 0\.1 s$/);
    expect(lines[1]).toMatch(/restarting in 0\.1 s$/);
    expect(lines[2]).toMatch(/restarting in 0\.2 s$/);
  });
});

// `npm start` keeps the web app up while the sidecar dies and comes back (the web app handles the
// live service being down). Uses the production build that `npm test`'s set-up makes first.
describe("npm start's processes: kill the sidecar", () => {
  let supervisor: Supervisor | undefined;
  let web: string;
  let sidecarHealth: string;
  let dropDb: (() => Promise<void>) | undefined;

  beforeAll(async () => {
    if (!existsSync(".next/BUILD_ID")) throw new Error("no production build: run the set-up (npm test builds before Vitest)");
    const store = await seededDb("supervised");
    dropDb = store.close;
    const [port, sidecarPort, mqttPort, smtpPort] = await Promise.all([freePort(), freePort(), freePort(), freePort()]);
    const env = {
      DATABASE_URL: store.url,
      SESSION_SECRET: SECRET,
      PORT: String(port),
      SIDECAR_PORT: String(sidecarPort),
      MQTT_PORT: String(mqttPort),
      SMTP_PORT: String(smtpPort),
      DEMO: "1",
    };
    web = `http://127.0.0.1:${port}/api/health`;
    sidecarHealth = `http://127.0.0.1:${sidecarPort}/health`;
    supervisor = supervise(
      [
        { name: "web", command: "node_modules/.bin/next", args: ["start", "-H", "127.0.0.1", "-p", String(port)], env },
        { name: "sidecar", command: node, args: ["--import", "tsx", "server/main.ts"], env },
      ],
      { initialDelayMs: 500, log: () => undefined },
    );
    await waitFor("the web app", 60_000, async () => (await status(web)) === 200);
    await waitFor("the sidecar", 60_000, async () => (await status(sidecarHealth)) === 200);
  }, 130_000);

  afterAll(async () => {
    await supervisor?.stop();
    await dropDb?.();
  });

  it("keeps /api/health answering 200 throughout and has the sidecar's /health back within 30 s", async () => {
    const pid = supervisor?.pid("sidecar");
    expect(pid).toBeGreaterThan(0);
    process.kill(pid ?? 0, "SIGKILL");
    const webStatuses: number[] = [];
    let back = false;
    const watching = (async () => {
      while (!back) {
        webStatuses.push(await status(web));
        await new Promise((r) => setTimeout(r, 200));
      }
    })();
    await waitFor("the sidecar down", 5000, async () => (await status(sidecarHealth)) !== 200);
    const ms = await waitFor("the sidecar back", 30_000, async () => (await status(sidecarHealth)) === 200);
    back = true;
    await watching;
    expect(ms).toBeLessThan(30_000);
    expect(supervisor?.restarts("sidecar")).toBe(1);
    expect(webStatuses.length).toBeGreaterThan(3);
    expect(webStatuses.every((s) => s === 200)).toBe(true);
  }, 60_000);
});
