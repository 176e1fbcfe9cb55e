import { expect, test } from "@playwright/test";
import { BenchPage } from "./pages/bench-page";
import { SignInPage } from "./pages/sign-in-page";

// Line pressure is sampled at 2 kHz (demo rig).
const CHANNEL = "hydraulic-press/press-ctl/line-pressure";

test("an engineer's bench keeps its candidates through a reload and a new sign-in until they are removed", async ({ page }) => {
  test.setTimeout(120_000);
  const signIn = new SignInPage(page);
  const bench = new BenchPage(page);
  await signIn.signInAs("engineer");
  await bench.open(CHANNEL);
  await expect(bench.candidateSummaries()).toHaveCount(0);

  const first = await bench.addCandidate();
  const kept = page.waitForResponse((r) => r.request().method() === "PUT" && r.url().endsWith(`/candidates/${first}`) && r.request().postData()?.includes('"cutoffHz":225') === true);
  await bench.setNumber("Cutoff", 225);
  expect((await kept).status()).toBe(200);
  await bench.closeEditor();
  const keptSecond = page.waitForResponse((r) => r.request().method() === "PUT" && r.url().includes("/candidates/") && !r.url().endsWith(`/candidates/${first}`));
  const second = await bench.addCandidate();
  await bench.closeEditor();
  const response = await keptSecond;
  expect(response.url()).toMatch(new RegExp(`/candidates/${second}$`));
  expect(response.status()).toBe(200);
  const shown = ["Butterworth LP 4 · 225 Hz", "Butterworth LP 4 · 200 Hz"];
  await expect(bench.candidateSummaries()).toHaveText(shown);

  await bench.open(CHANNEL, { keepCandidates: true });
  await expect(bench.candidateSummaries()).toHaveText(shown);
  await expect(page.locator("[data-trace]").first()).toHaveAttribute("data-trace", first);

  await signIn.signOut();
  await signIn.signInAs("engineer");
  await bench.open(CHANNEL, { keepCandidates: true });
  await expect(bench.candidateSummaries()).toHaveText(shown);

  await bench.removeKeptCandidates();
  await expect(bench.candidateSummaries()).toHaveCount(0);
  await bench.open(CHANNEL, { keepCandidates: true });
  await expect(bench.candidateSummaries()).toHaveCount(0);
});
