import { fork, type ChildProcess } from "node:child_process";
import { expect, test, type Page } from "@playwright/test";
import mqtt from "mqtt";
import { samplesTopic } from "@/lib/protocol";
import { mosquitto } from "../integration/sidecar-support";
import { BenchPage } from "./pages/bench-page";
import { SignInPage } from "./pages/sign-in-page";

// Two partitioned sidecars (the lease tests' runner) on a mosquitto of this spec's own, beside the
// run's usual sidecar; playwright.config.ts lets the pages connect to them (SIDECAR_WS_ORIGINS).
const CHANNEL = "hydraulic-press/env-node/frame-strain"; // 1 kHz
const MQTT_PORT = Number(process.env.E2E_LEASE_MQTT_PORT ?? 18910);
const PORTS = { "follow-a": Number(process.env.E2E_LEASE_PORT_A ?? 3310), "follow-b": Number(process.env.E2E_LEASE_PORT_B ?? 3311) };

function startSidecar(id: keyof typeof PORTS, mqttUrl: string): Promise<ChildProcess> {
  const databaseUrl = process.env.DATABASE_URL;
  const secret = process.env.SESSION_SECRET;
  if (!databaseUrl || !secret) throw new Error("DATABASE_URL and SESSION_SECRET must be set (source server/run/setup.sh)");
  const child = fork("tests/integration/support/lease-sidecar.ts", [databaseUrl, mqttUrl, id, String(PORTS[id]), secret], {
    execArgv: ["--import", "tsx"],
    stdio: ["ignore", "ignore", "inherit", "ipc"],
  });
  return new Promise((resolve, reject) => {
    child.on("message", (m: { type: string }) => m.type === "ready" && resolve(child));
    child.once("exit", (code) => reject(new Error(`sidecar ${id} exited with ${code}`)));
  });
}

async function owner(page: Page): Promise<string | null> {
  const res = await page.request.get(`/api/v1/live/owner?channel=${encodeURIComponent(CHANNEL)}`);
  return ((await res.json()) as { wsUrl: string | null }).wsUrl;
}

async function framesShown(page: Page): Promise<number> {
  return Number((await page.getByTestId("live-readout").getAttribute("data-frames")) ?? 0);
}

test("the bench follows its channel to another sidecar without a reload", async ({ page }) => {
  test.setTimeout(120_000);
  const broker = await mosquitto(undefined, MQTT_PORT);
  const device = await mqtt.connectAsync(broker.url, { reconnectPeriod: 0 });
  let seq = 0;
  const start = Date.now();
  const publishing = setInterval(() => {
    const values = Array.from({ length: 50 }, (_, i) => 20 * Math.sin((2 * Math.PI * 50 * (seq * 50 + i)) / 1000));
    void device.publishAsync(samplesTopic(CHANNEL), JSON.stringify({ seq, t0: start + seq * 50, sampleRateHz: 1000, values }));
    seq++;
  }, 50);
  const sidecars = new Map<string, ChildProcess>();
  const sockets: string[] = [];
  page.on("websocket", (ws) => sockets.push(ws.url()));
  try {
    sidecars.set("follow-a", await startSidecar("follow-a", broker.url));
    await new SignInPage(page).signInAs("engineer");
    await expect.poll(() => owner(page), { timeout: 15_000 }).toBe(`ws://127.0.0.1:${PORTS["follow-a"]}/ws`);
    const bench = new BenchPage(page);
    await bench.open(CHANNEL);
    await page.evaluate(() => sessionStorage.setItem("still-the-same-page", "yes"));
    await expect.poll(() => framesShown(page), { timeout: 15_000 }).toBeGreaterThan(5);

    // A second sidecar joins: half the channels move to it. Then the holder of this channel dies.
    sidecars.set("follow-b", await startSidecar("follow-b", broker.url));
    await expect.poll(async () => (await page.request.get("/api/v1/live/overview")).status(), { timeout: 15_000 }).toBe(200);
    await page.waitForTimeout(4000);
    const holder = (await owner(page)) === `ws://127.0.0.1:${PORTS["follow-a"]}/ws` ? "follow-a" : "follow-b";
    const other = holder === "follow-a" ? "follow-b" : "follow-a";
    sidecars.get(holder)!.kill("SIGKILL");
    const killedAt = Date.now();
    await expect.poll(() => owner(page), { timeout: 12_000 }).toBe(`ws://127.0.0.1:${PORTS[other]}/ws`);
    const before = await framesShown(page);
    await expect.poll(() => framesShown(page), { timeout: 20_000 }).toBeGreaterThan(before + 5);
    console.log(`frames resumed ${((Date.now() - killedAt) / 1000).toFixed(1)} s after the holder was killed`);
    expect(sockets.some((u) => u.includes(`:${PORTS[other]}/`))).toBe(true);
    expect(await page.evaluate(() => sessionStorage.getItem("still-the-same-page"))).toBe("yes");
    await expect(page.getByTestId("link-state")).toHaveAttribute("data-link", "live");
    await page.screenshot({ path: "/tmp/bench-follows.png", fullPage: false });
  } finally {
    clearInterval(publishing);
    for (const child of sidecars.values()) {
      if (child.exitCode !== null || child.signalCode !== null) continue; // the killed one
      const exited = new Promise((r) => child.once("exit", r));
      child.send({ type: "stop" }); // leaves the sidecar list, so the other specs see the run's one sidecar again
      await Promise.race([exited, new Promise((r) => setTimeout(r, 5000))]);
      if (child.exitCode === null && child.signalCode === null) child.kill("SIGKILL");
    }
    await device.endAsync();
    await broker.stop();
  }
});
