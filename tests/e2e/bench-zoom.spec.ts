import { expect, test } from "@playwright/test";
import { BenchPage } from "./pages/bench-page";
import { SignInPage } from "./pages/sign-in-page";

// Frame strain: 1 kHz, a 50 Hz hum and drift (demo rig), so a 1 s window always holds a visible trace.
const CHANNEL = "hydraulic-press/env-node/frame-strain";

test("a paused 1 s window zooms into the traces it holds instead of going blank", async ({ page }) => {
  test.setTimeout(90_000);
  await new SignInPage(page).signInAs("engineer");
  const bench = new BenchPage(page);
  await bench.open(CHANNEL);
  await bench.setWindow(1);
  await bench.expectTraceMoving("raw");
  await expect.poll(() => bench.plottedPixels(bench.liveChart), { timeout: 10_000 }).toBeGreaterThan(200);
  await bench.pause();
  // The stream runs on for longer than the window before the engineer zooms into what was paused.
  await page.waitForTimeout(2_500);
  await bench.dragZoom(bench.liveChart, 0.3, 0.6);
  await page.waitForTimeout(500);
  await page.screenshot({ path: test.info().outputPath("paused-zoom.png") });
  expect(await bench.plottedPixels(bench.liveChart), "the zoomed plot still draws the raw trace").toBeGreaterThan(200);
  // A double click goes back to the whole paused window, still drawn.
  await bench.liveChart.locator(".u-over").dblclick();
  await page.waitForTimeout(300);
  expect(await bench.plottedPixels(bench.liveChart)).toBeGreaterThan(200);
});
