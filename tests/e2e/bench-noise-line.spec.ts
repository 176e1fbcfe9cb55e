import { expect, test } from "@playwright/test";
import { BenchPage } from "./pages/bench-page";
import { SignInPage } from "./pages/sign-in-page";

// Frame strain: 1 kHz (Nyquist 500 Hz), 50 Hz hum on a slow thermal drift (demo rig).
const CHANNEL = "hydraulic-press/env-node/frame-strain";

test("the engineer sees which noise line is judged, picks a peak or types one, and the live metrics follow with the table's figure", async ({ page }) => {
  test.setTimeout(120_000);
  await new SignInPage(page).signInAs("engineer");
  const bench = new BenchPage(page);
  await bench.open(CHANNEL);
  const id = await bench.addCandidate();
  await bench.closeEditor();

  const judged = page.getByTestId("noise-line-judged");
  const table = page.getByTestId("comparison-table");
  const row = table.locator(`tr[data-row="${id}"]`);
  const header = (n: number) => table.locator("th").nth(n);
  await expect(judged).toContainText("(the strongest peak)", { timeout: 20_000 });

  // Pick the hum's peak in the live spectrum: the label, the table's column and the live column name it.
  const spectrum = bench.liveSpectrum();
  await bench.holdWithPeaksNear(spectrum, [50]);
  const peak = (await bench.peaks(spectrum)).find((p) => Math.abs(p.hz - 50) <= 1)!;
  await spectrum.locator(`li[data-hz="${peak.hz}"]`).getByRole("button", { name: /^Judge attenuation at/ }).click();
  await expect(judged).toContainText("(a peak you picked)");
  const line = (await judged.textContent())!.split(" (")[0];
  await expect(header(4)).toHaveText(`Atten. at ${line}`);
  await expect(header(11)).toHaveText(`Live atten. at ${line} (measured / predicted)`, { timeout: 20_000 });
  // At one frequency the live prediction is the table's figure.
  await expect.poll(async () => (await row.locator("td").nth(11).textContent())?.split(" / ")[1], { timeout: 20_000 }).toBe(await row.locator("td").nth(4).textContent());

  // A typed line outside 0 < f < fs/2 is refused in words; one inside is judged, here and live.
  const typed = page.getByLabel("Judge at another frequency (Hz)");
  await typed.fill("600");
  await page.getByRole("button", { name: "Judge here" }).click();
  await expect(page.getByRole("alert").filter({ hasText: "between 0 and 500 Hz" })).toBeVisible();
  await typed.fill("120");
  await page.getByRole("button", { name: "Judge here" }).click();
  await expect(judged).toHaveText("120 Hz (a frequency you typed)");
  await expect(header(4)).toHaveText("Atten. at 120 Hz");
  await expect(header(11)).toHaveText("Live atten. at 120 Hz (measured / predicted)", { timeout: 20_000 });
  await expect.poll(async () => (await row.locator("td").nth(11).textContent())?.split(" / ")[1], { timeout: 20_000 }).toBe(await row.locator("td").nth(4).textContent());

  await page.getByRole("button", { name: "Use the strongest peak" }).click();
  await expect(judged).toContainText("(the strongest peak)");
});
