import { readFile } from "node:fs/promises";
import { expect, test, type Locator, type Page } from "@playwright/test";
import { BenchPage } from "./pages/bench-page";
import { SignInPage } from "./pages/sign-in-page";

// Frame strain: 1 kHz, a 50 Hz hum and drift (demo rig); its response charts run up to the 500 Hz Nyquist frequency.
const CHANNEL = "hydraulic-press/env-node/frame-strain";
const SHOTS = "/tmp/shots-charts";

/** A frequency in the chart's words ("12.3 Hz", "1.2 kHz") in Hz. */
function hzOf(text: string): number {
  const m = /(−?[\d.]+) (k?)Hz/.exec(text);
  if (!m) throw new Error(`no frequency in "${text}"`);
  return Number(m[1].replace("−", "-")) * (m[2] ? 1000 : 1);
}

/** The cursor summary's parts: A, B and Δf in Hz. */
async function cursorFrequencies(frame: Locator): Promise<{ a: number; b: number; df: number }> {
  const text = (await frame.getByTestId("cursor-summary").textContent()) ?? "";
  const [a, b, df] = text.split(" · ");
  return { a: hzOf(a), b: hzOf(b), df: hzOf(df) };
}

async function clickPlot(page: Page, chart: Locator, fraction: number): Promise<void> {
  const box = await chart.locator(".u-over").boundingBox();
  if (!box) throw new Error("the chart has no plot area");
  await page.mouse.click(box.x + box.width * fraction, box.y + box.height * 0.5);
}

test("chart tools: cursors read Δf, CSV and PNG downloads, the editor closes on Escape, the keyboard moves a cursor", async ({ page }) => {
  test.setTimeout(120_000);
  await page.setViewportSize({ width: 1400, height: 1000 });
  await new SignInPage(page).signInAs("engineer");
  const bench = new BenchPage(page);
  await bench.open(CHANNEL);

  // The editor takes focus when it opens, Escape closes it and focus goes back to the control that opened it.
  await bench.addCandidate();
  await expect(bench.editor.getByRole("heading", { name: /^Edit Candidate/ })).toBeFocused();
  await page.screenshot({ path: `${SHOTS}/editor-open.png` });
  await page.keyboard.press("Escape");
  await expect(bench.editor).toHaveCount(0);
  await expect(bench.addCandidateButton()).toBeFocused();

  // Two cursors on the magnitude chart, placed by clicks once the toolbar's Cursors is on.
  await bench.showView("Response");
  const magnitude = page.getByTestId("bode-magnitude");
  const frame = page.getByTestId("bode-magnitude-frame");
  await expect(magnitude.locator("canvas")).toBeVisible();
  const cursorsButton = frame.getByRole("button", { name: "Cursors" });
  await cursorsButton.click();
  await expect(cursorsButton).toHaveAttribute("aria-pressed", "true");
  await clickPlot(page, magnitude, 0.3);
  await clickPlot(page, magnitude, 0.75);
  await expect(frame.getByTestId("cursor-summary")).toContainText("Δf");
  const placed = await cursorFrequencies(frame);
  expect(placed.b).toBeGreaterThan(placed.a);
  // Δf is B − A (each shown to 4 significant figures, so within the rounding of the larger).
  expect(Math.abs(placed.df - (placed.b - placed.a))).toBeLessThanOrEqual(placed.b * 1e-3);
  const rows = frame.getByTestId("cursor-readout").locator("tbody tr");
  await expect(rows.first()).toContainText("Candidate A");
  await expect(rows.first()).toContainText("dB");
  await frame.scrollIntoViewIfNeeded();
  await page.screenshot({ path: `${SHOTS}/response-cursors.png` });
  // A drag still zooms and a double click still resets it; neither moves the cursors.
  const before = await frame.getByTestId("cursor-summary").textContent();
  await bench.dragZoom(magnitude, 0.2, 0.8);
  await magnitude.locator(".u-over").dblclick();
  await expect(frame.getByTestId("cursor-summary")).toHaveText(before ?? "");

  // CSV: a header with the x column and each series with its unit, then one row per frequency of the grid.
  const [csvDownload] = await Promise.all([page.waitForEvent("download"), frame.getByRole("button", { name: /as CSV$/ }).click()]);
  expect(csvDownload.suggestedFilename()).toMatch(/^magnitude.*-\d{8}-\d{6}\.csv$/);
  const csv = await readFile(await csvDownload.path(), "utf8");
  const lines = csv.split("\r\n").filter((l) => l !== "");
  const header = lines[0].split(",");
  expect(header[0]).toBe("Frequency (Hz)");
  expect(header).toContain("Candidate A (dB)");
  expect(lines.length - 1, "one row per point of the response grid").toBeGreaterThan(500);
  const freqs = lines.slice(1).map((l) => {
    expect(l.split(",")).toHaveLength(header.length);
    return Number(l.split(",")[0]);
  });
  expect(freqs.every((f, i) => i === 0 || f > freqs[i - 1]), "frequencies ascend").toBe(true);
  expect(freqs[freqs.length - 1]).toBeLessThanOrEqual(500);

  // PNG: a real picture, wider than the plot and of some size.
  const [pngDownload] = await Promise.all([page.waitForEvent("download"), frame.getByRole("button", { name: /as a PNG picture$/ }).click()]);
  expect(pngDownload.suggestedFilename()).toMatch(/\.png$/);
  const png = await readFile(await pngDownload.path());
  expect([...png.subarray(0, 8)]).toEqual([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]);
  expect(png.length).toBeGreaterThan(8_000);
  const plotWidth = (await magnitude.locator("canvas").boundingBox())?.width ?? 0;
  expect(png.readUInt32BE(16), "IHDR width").toBeGreaterThanOrEqual(Math.floor(plotWidth));
  const viewer = await page.context().newPage();
  await viewer.setContent(`<body style="margin:0;background:#fff"><img src="data:image/png;base64,${png.toString("base64")}"></body>`);
  await viewer.screenshot({ path: `${SHOTS}/exported.png`, fullPage: true });
  await viewer.close();

  // The keyboard reaches the phase chart from its toolbar; Enter places A, the arrows move it, Enter places B, Escape clears.
  const phaseFrame = page.getByTestId("bode-phase-frame");
  const phase = page.getByTestId("bode-phase");
  await phaseFrame.getByRole("button", { name: /as a PNG picture$/ }).focus();
  await page.keyboard.press("Tab");
  await expect(phase).toBeFocused();
  await page.keyboard.press("Enter");
  const summary = phaseFrame.getByTestId("cursor-summary");
  await expect(summary).toContainText(/^A /);
  const atStart = hzOf((await summary.textContent()) ?? "");
  await page.keyboard.press("Shift+ArrowRight");
  await expect.poll(async () => hzOf((await summary.textContent()) ?? "")).toBeGreaterThan(atStart);
  await page.keyboard.press("Enter");
  await page.keyboard.press("Shift+ArrowLeft");
  await page.keyboard.press("ArrowLeft");
  await expect(summary).toContainText("Δf −");
  await phaseFrame.scrollIntoViewIfNeeded();
  await page.screenshot({ path: `${SHOTS}/phase-keyboard.png` });
  await page.keyboard.press("Escape");
  await expect(summary).toHaveText("");
  await expect(phase).toBeFocused();

  // On the paused live traces the cursors read a time difference in ms, with its frequency.
  await bench.setWindow(1);
  await bench.pause();
  const liveFrame = page.getByTestId("live-chart-frame");
  await liveFrame.getByRole("button", { name: "Cursors" }).click();
  await clickPlot(page, bench.liveChart, 0.4);
  await clickPlot(page, bench.liveChart, 0.6);
  await expect(liveFrame.getByTestId("cursor-summary")).toContainText(/Δt \d+(\.\d+)? ms \(1\/Δt [\d.]+ Hz\)/);
  await expect(liveFrame.getByTestId("cursor-readout").locator("tbody tr").first()).toContainText("µε");
  await liveFrame.scrollIntoViewIfNeeded();
  await page.screenshot({ path: `${SHOTS}/live-cursors.png` });
});
