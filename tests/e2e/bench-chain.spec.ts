import { expect, test } from "@playwright/test";
import { BenchPage } from "./pages/bench-page";
import { SetsPage } from "./pages/sets-page";
import { SignInPage } from "./pages/sign-in-page";

// Needs the sidecar with the demo rig running (server/main.ts, DEMO=1) beside the web server.
// Frame strain (1 kHz) carries 50 Hz hum and its 150 Hz harmonic over broadband noise.
const CHANNEL = "hydraulic-press/env-node/frame-strain";
/** How far below raw the candidate's spectrum must sit at a hum line, in dB (a notch leaves the noise floor). */
const HUM_DROP_DB = 20;

test("an engineer builds a notch, notch, low-pass chain from the live spectrum, sees the hum fall and saves it", async ({ page }) => {
  test.setTimeout(120_000);
  await new SignInPage(page).signInAs("engineer");
  const bench = new BenchPage(page);
  await bench.open(CHANNEL);

  const live = bench.liveSpectrum();
  await bench.holdWithPeaksNear(live, [50, 150]);
  const hum = await bench.notchPeakNear(live, 50);
  await expect(bench.editor).toBeVisible();
  const candidate = (await page.locator("[data-trace]").first().getAttribute("data-trace")) ?? "";
  const harmonic = await bench.notchPeakNear(live, 150);
  await bench.addStage("IIR (classic families)");

  await expect(bench.stages()).toHaveCount(3);
  await expect(bench.stages().getByTestId("stage-summary")).toHaveText([`Notch biquad · ${hum}, Q 30`, `Notch biquad · ${harmonic}, Q 30`, "Butterworth LP 4 · 100 Hz"]);
  await expect(bench.summary(candidate)).toHaveText(/^Notch biquad · .* → Notch biquad · .* → Butterworth LP 4 · 100 Hz$/);
  await expect(bench.editor.locator("[data-caution=notch]")).toContainText("Hz and 1");

  // The hum lines fall in the candidate's live spectrum: well below raw at 50 and 150 Hz.
  await bench.showView("Spectrum");
  const shown = bench.shownSpectrum();
  const drop = async (f: number) => {
    const peak = (await bench.peaks(shown)).find((p) => Math.abs(p.hz - f) <= 1);
    const raw = peak?.levels.raw;
    const filtered = peak?.levels[candidate];
    return raw == null || filtered == null ? null : raw - filtered;
  };
  await expect.poll(() => drop(50), { timeout: 30_000, message: "the 50 Hz line falls" }).toBeGreaterThan(HUM_DROP_DB);
  await expect.poll(() => drop(150), { timeout: 10_000, message: "the 150 Hz line falls" }).toBeGreaterThan(HUM_DROP_DB);

  // Every analysis view shows the chain with its stages.
  await bench.showView("Poles");
  await expect(page.getByTestId("pz-stages")).toBeVisible();
  await expect(page.getByRole("list", { name: /^Stages of Candidate/ }).getByRole("listitem")).toHaveCount(3);
  await bench.showView("Fixed point");
  await expect(page.getByTestId("stage-headroom").locator("tbody tr")).toHaveCount(3);
  await expect(page.getByTestId("comparison-table").locator(`[data-row="${candidate}"]`)).toContainText("Chain of 3");

  const name = `Frame strain hum chain ${Date.now()}`;
  const save = await bench.saveAsNewSet(name, "Notches at the 50 Hz hum and its 150 Hz harmonic, then a low-pass; built from the live spectrum.");
  await expect(save.getByRole("status")).toContainText("Saved as revision 1", { timeout: 20_000 });
  await save.getByRole("link", { name: "Open the set" }).click();

  const sets = new SetsPage(page);
  const stages = sets.revision(1).getByTestId("revision-stages").getByRole("listitem");
  await expect(stages).toHaveText([`Notch biquad · ${hum}, Q 30`, `Notch biquad · ${harmonic}, Q 30`, "Butterworth LP 4 · 100 Hz"]);
});

test("an engineer adds a harmonic series up to Nyquist, is told where the stage limit cut it, reorders by keyboard and bypasses a stage", async ({ page }) => {
  // Every edit of an 8-stage chain redoes its designs, cautions (quantization) and views in the browser.
  test.setTimeout(120_000);
  await new SignInPage(page).signInAs("engineer");
  const bench = new BenchPage(page);
  await bench.open(CHANNEL);
  await bench.addCandidate();

  const series = bench.editor.getByRole("form", { name: "Harmonic series" });
  await bench.editor.getByText("Harmonic series of notches").click();
  await series.getByLabel("Fundamental").fill("50");
  await series.getByLabel("Up to Nyquist").check();
  await series.getByRole("button", { name: "Add notches" }).click();
  await expect(bench.stages()).toHaveCount(8);
  await expect(bench.editor.getByRole("status")).toHaveText("Added 7 of 9 notches: a chain holds at most 8 stages, so 2 harmonics were left out.");
  await expect(bench.editor.getByRole("button", { name: "Add stage" })).toBeDisabled();

  // Move the low-pass (stage 1) down with the keyboard: focus stays on the moved stage.
  await bench.editor.getByRole("button", { name: "Move stage 1 down" }).focus();
  await page.keyboard.press("Enter");
  await expect(bench.editor.getByRole("button", { name: "Move stage 2 down" })).toBeFocused();
  await page.keyboard.press("Enter");
  await expect(bench.stages().nth(2).getByTestId("stage-summary")).toHaveText(/Butterworth LP 4/);

  await bench.editor.getByRole("checkbox", { name: "Bypass stage 3" }).check();
  await expect(bench.stages().nth(2)).toHaveAttribute("data-bypassed", "true");
  await expect(page.locator("[data-trace]").first().getByTestId("candidate-summary")).toHaveText(/\(1 bypassed\)$/);
});
