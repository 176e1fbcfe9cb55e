import { expect, test, type Page } from "@playwright/test";
import { BenchPage } from "./pages/bench-page";
import { SignInPage } from "./pages/sign-in-page";

// Frame strain is sampled at 1 kHz (demo rig), so Nyquist is 500 Hz.
const CHANNEL = "hydraulic-press/env-node/frame-strain";

/** Signs in as an engineer, opens the channel's bench and adds a candidate (its editor open). */
async function newCandidate(page: Page): Promise<{ bench: BenchPage; candidate: string }> {
  await new SignInPage(page).signInAs("engineer");
  const bench = new BenchPage(page);
  await bench.open(CHANNEL);
  return { bench, candidate: await bench.addCandidate() };
}

test("an engineer cannot save while the editor holds a cutoff above Nyquist; a fixed value saves exactly what is shown", async ({ page }) => {
  test.setTimeout(90_000);
  const { bench, candidate } = await newCandidate(page);
  const save = bench.editor.getByRole("region", { name: "Save" });
  const button = save.getByRole("button", { name: "Save as a new set" });
  await expect(button).toBeEnabled();

  await bench.setNumber("Cutoff", 600);
  await expect(bench.editor.getByRole("alert").first()).toContainText("600");
  await expect(button).toBeDisabled();
  await expect(bench.editor.getByRole("status").filter({ hasText: "Not applied" })).toBeVisible();
  // The card still names the design that runs, not the refused value.
  await expect(bench.summary(candidate)).toHaveText("Butterworth LP 4 · 100 Hz");

  await bench.setNumber("Cutoff", 120);
  await expect(bench.summary(candidate)).toHaveText("Butterworth LP 4 · 120 Hz");
  await expect(button).toBeEnabled();
  const saved = await bench.saveAsNewSet(`Frame strain 120 Hz ${Date.now()}`, "Saved after a refused cutoff.");
  await expect(saved.getByRole("status")).toContainText("Saved as revision 1", { timeout: 20_000 });
  // The saved message holds only while the design shown is the one saved.
  await bench.setNumber("Cutoff", 130);
  await expect(saved.getByRole("status")).toContainText("The design changed after it was saved as revision 1; the one shown now is not saved.");
  await bench.setNumber("Cutoff", 120);
  await expect(saved.getByRole("status")).toContainText("Saved as revision 1");
  await saved.getByRole("link", { name: "Open the set" }).click();
  await expect(page.getByTestId("revision-stages").first()).toContainText("Butterworth LP 4 · 120 Hz");
});

test("pasted coefficients with a0 = 0 are refused beside the field, and nothing else runs or saves in their place", async ({ page }) => {
  test.setTimeout(90_000);
  const { bench, candidate } = await newCandidate(page);
  await bench.chooseKind("Pasted coefficients");
  await expect(bench.summary(candidate)).toHaveText("Pasted b/a · 3/1 coefficients");

  await bench.editor.getByLabel("a (denominator, empty for FIR)").fill("0, 1");
  await expect(bench.editor.getByRole("alert").filter({ hasText: "a0, must be nonzero" })).toBeVisible();
  await expect(bench.editor.getByRole("status").filter({ hasText: "Not applied" })).toBeVisible();
  await expect(bench.editor.getByRole("region", { name: "Save" }).getByRole("button", { name: "Save as a new set" })).toBeDisabled();
  await expect(bench.summary(candidate)).toHaveText("Pasted b/a · 3/1 coefficients");
});

test("a cutoff typed with a decimal comma is refused in plain words and never applied as another number", async ({ page }) => {
  test.setTimeout(90_000);
  const { bench, candidate } = await newCandidate(page);
  await bench.editor.getByLabel("Cutoff", { exact: false }).fill("12,5");
  await expect(bench.editor.getByRole("alert").filter({ hasText: "Write decimals with a point: 12.5, not 12,5." })).toBeVisible();
  await expect(bench.summary(candidate)).toHaveText("Butterworth LP 4 · 100 Hz");
  await expect(bench.editor.getByRole("region", { name: "Save" }).getByRole("button", { name: "Save as a new set" })).toBeDisabled();
  await bench.editor.getByLabel("Cutoff", { exact: false }).fill("12.5");
  await expect(bench.summary(candidate)).toHaveText("Butterworth LP 4 · 12.5 Hz");
});

test("a pasted integrator is flagged marginal in red, and the raw trace and its row stay readable while it diverges", async ({ page }) => {
  test.setTimeout(90_000);
  const { bench, candidate } = await newCandidate(page);
  await bench.chooseKind("Pasted coefficients");
  await bench.editor.getByLabel("b (numerator)").fill("1");
  await bench.editor.getByLabel("a (denominator, empty for FIR)").fill("1, -1");
  await expect(bench.summary(candidate)).toHaveText("Pasted b/a · 1/2 coefficients");
  const caution = bench.editor.locator("[data-caution=poles]");
  await expect(caution).toHaveAttribute("data-level", "danger");
  await expect(caution).toContainText("Marginally stable filter");
  await expect(page.getByTestId("comparison-table").locator(`[data-row="${candidate}"]`)).toContainText("Unstable or marginal");
  await bench.expectTraceMoving("raw");
  await page.screenshot({ path: test.info().outputPath("integrator.png"), fullPage: true });
});
