import { expect, test, type Page } from "@playwright/test";
import { BenchPage } from "./pages/bench-page";
import { SAME_ORIGIN } from "./pages/origin";
import { SetsPage } from "./pages/sets-page";
import { SignInPage } from "./pages/sign-in-page";

// Shaft speed: 500 Hz on a Q15 device in the demo lab; no other end-to-end test deploys to it.
const CHANNEL = "gearbox-endurance/torque-node/shaft-speed";
const lowPass = { kind: "iir", family: "butterworth", response: "lowpass", order: 2, cutoffHz: 20, sampleRateHz: 500 };
// A pole at z = 1.2, outside the unit circle: saved, but marked not deployable.
const unstable = { kind: "coefficients", b: [0.5, 0.5], a: [1, -1.2], sampleRateHz: 500 };

async function submitted(page: Page, name: string, spec: unknown): Promise<{ setId: number; revisionId: number }> {
  const saved = await SetsPage.createThroughApi(page.request, { channel: CHANNEL, name, spec });
  const res = await page.request.post(`/api/v1/revisions/${saved.revisionId}/transitions`, { data: { action: "submit", expectedVersion: 1 }, headers: SAME_ORIGIN });
  expect(res.status(), await res.text()).toBe(200);
  return saved;
}

test("review and set pages chart the revision; Approve is not offered on one marked not deployable; an operator's open bench follows promotion and the return to no filter", async ({ page, browser }) => {
  test.setTimeout(180_000);
  const stamp = Date.now().toString(36);
  const good = `E2E speed LP 20 ${stamp}`;
  const bad = `E2E speed unstable ${stamp}`;
  const signIn = new SignInPage(page);
  const sets = new SetsPage(page);

  await signIn.signInAs("engineer");
  const { setId } = await submitted(page, good, lowPass);
  await submitted(page, bad, unstable);
  await signIn.signOut();

  // The lead reviews with the response, the pole-zero map, the sections and the Q15 words in view.
  await signIn.signInAs("lead");
  await page.goto("/reviews");
  const goodCard = page.locator("article", { hasText: good });
  const badCard = page.locator("article", { hasText: bad });
  for (const id of ["bode-magnitude", "bode-phase"]) await expect(goodCard.getByTestId(id).locator("canvas").first()).toBeVisible();
  // The map draws the two poles of the second-order low-pass.
  await expect(goodCard.getByTestId("pz-z")).toBeVisible();
  // One section of five Q15 words (b0, b1, b2, a1, a2), each an integer in [−32768, 32767].
  await expect(goodCard.getByTestId("revision-sections").locator("tbody tr")).toHaveCount(1);
  const words = (await goodCard.getByTestId("fixed-words").first().innerText()).split(", ").map(Number);
  expect(words.length).toBeGreaterThanOrEqual(5);
  for (const w of words) expect(Number.isInteger(w) && w >= -32768 && w <= 32767, `word ${w}`).toBe(true);
  await expect(goodCard.getByRole("button", { name: "Approve" })).toBeVisible();
  await expect(badCard.getByTestId("bode-magnitude")).toBeVisible();
  await expect(badCard.getByRole("button", { name: "Approve" })).toHaveCount(0);
  await expect(badCard.getByTestId("not-approvable")).toContainText("not deployable");
  await expect(badCard.getByRole("button", { name: "Reject" })).toBeVisible();
  await goodCard.scrollIntoViewIfNeeded();
  await page.screenshot({ path: "test-results/review-charts.png", fullPage: true });
  await sets.approveFromReviews(good, "Response and words checked.");

  await sets.open(setId);
  await expect(sets.revision(1).getByTestId("bode-magnitude")).toBeVisible();
  await expect(sets.revision(1).getByTestId("pz-z")).toBeVisible();
  await page.screenshot({ path: "test-results/set-charts.png", fullPage: true });

  // An operator watches the channel's bench; it must follow without a reload.
  const operator = await browser.newPage();
  await new SignInPage(operator).signInAs("operator");
  const bench = new BenchPage(operator);
  await bench.open(CHANNEL);
  await expect(operator.getByText(/^No production filter is active on this channel: the device sends raw samples/)).toBeVisible();
  await operator.evaluate(() => document.documentElement.setAttribute("data-not-reloaded", "yes"));

  await sets.promote(1, [CHANNEL]);
  await expect(sets.deployment(CHANNEL)).toHaveAttribute("data-state", "active", { timeout: 20_000 });
  // The set page learns of the ack by polling; the bench is told by the sidecar, so a few seconds is ample.
  await expect(operator.getByText(`Production: ${good} revision 1`)).toBeVisible({ timeout: 5_000 });
  await expect(operator.getByTestId("comparison-table")).toContainText(`Production (${good} r1)`);
  await expect(operator.locator("html")).toHaveAttribute("data-not-reloaded", "yes");
  await operator.screenshot({ path: "test-results/bench-after-push.png", fullPage: true });

  // The first promotion goes back to no filter, asked for and confirmed like any rollback.
  const back = page.getByTestId(`rollback-${CHANNEL}`);
  await back.getByRole("button", { name: `Return ${CHANNEL} to no filter` }).click();
  await expect(back.getByRole("alertdialog")).toContainText("passes the raw signal through unfiltered");
  await back.getByRole("button", { name: `Yes, return ${CHANNEL} to no filter` }).click();
  await expect(page.locator(`tr[data-channel="${CHANNEL}"][data-state="active"]`)).toContainText("no filter", { timeout: 20_000 });
  await expect(page.locator(`tr[data-channel="${CHANNEL}"][data-state="rolled_back"]`)).toHaveCount(1);
  await expect(operator.getByText(/^No production filter is active on this channel: the device sends raw samples/)).toBeVisible({ timeout: 5_000 });
  await expect(operator.locator("html")).toHaveAttribute("data-not-reloaded", "yes");
  const production = await page.request.get(`/api/v1/channels/${CHANNEL}/production`);
  expect(production.status()).toBe(404);
  await operator.close();
});
