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

test("a 49.98 Hz notch is drawn at its depth, and zooming the magnitude zooms the phase with a grid of its own", async ({ page }) => {
  test.setTimeout(180_000);
  await new SignInPage(page).signInAs("engineer");
  const bench = new BenchPage(page);
  await bench.open(CHANNEL);
  const candidate = await bench.addCandidate();
  await bench.chooseKind("Notch / peak (bandwidth Q)");
  await bench.setNumber("Centre(Hz)", 49.98);
  await expect(bench.summary(candidate)).toContainText("49.98 Hz, Q 30");
  await bench.closeEditor();
  await bench.showView("Response");
  const magnitude = page.getByTestId("bode-magnitude");
  const phase = page.getByTestId("bode-phase");
  await expect(magnitude.locator("canvas")).toBeVisible();
  await magnitude.scrollIntoViewIfNeeded();
  await magnitude.screenshot({ path: test.info().outputPath("notch-response.png") });
  // The band spans 0.05 … 499.5 Hz on a log axis: the notch at 49.98 Hz sits at 3/4 of the width.
  await bench.dragZoom(magnitude, 0.7, 0.8);
  await expect(page.getByTestId("frequency-zoom")).toBeVisible();
  const zoomText = (await page.getByTestId("frequency-zoom").textContent()) ?? "";
  const [lo, hi] = [...zoomText.matchAll(/([\d.]+) Hz/g)].map((m) => Number(m[1]));
  expect(lo).toBeLessThan(49.98);
  expect(hi).toBeGreaterThan(49.98);
  await page.waitForTimeout(500);
  await page.screenshot({ path: test.info().outputPath("notch-zoomed.png") });
  expect(await bench.plottedPixels(phase), "the phase chart follows into the zoomed range").toBeGreaterThan(50);
  await magnitude.locator(".u-over").dblclick();
  await expect(page.getByTestId("frequency-zoom")).toHaveCount(0);
});
