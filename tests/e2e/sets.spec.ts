import { expect, test } from "@playwright/test";
import { SetsPage } from "./pages/sets-page";
import { BenchPage } from "./pages/bench-page";
import { SignInPage } from "./pages/sign-in-page";
import { SAME_ORIGIN } from "./pages/origin";

const CHANNEL = "gearbox-endurance/torque-node/input-torque";
const spec = { kind: "iir", family: "butterworth", response: "lowpass", order: 4, cutoffHz: 90, sampleRateHz: 1000 };

/**
 * The whole review-and-deploy path in one browser: an engineer saves (through the API, as the bench
 * does) and submits, a lead approves and promotes, the demo device acknowledges through the sidecar,
 * and the set page shows the deployment active. Needs the sidecar (deployment worker, demo rig) running.
 */
test("engineer submits, lead approves and promotes, the device acknowledges", async ({ page, browser }) => {
  test.setTimeout(120_000);
  const name = `E2E torque LP ${Date.now().toString(36)}`;
  const signIn = new SignInPage(page);
  const sets = new SetsPage(page);

  await signIn.signInAs("engineer");
  const { setId } = await SetsPage.createThroughApi(page.request, { channel: CHANNEL, name, notes: "e2e", spec });
  await sets.openList();
  await sets.search(name);
  await expect(sets.row(setId)).toContainText("Draft");
  await sets.row(setId).getByRole("link", { name }).click();
  await expect(page.getByTestId("set-name")).toHaveText(name);
  await expect(page.getByTestId("promote-form")).toHaveCount(0);
  await sets.submitForReview(1);
  await signIn.signOut();

  await signIn.signInAs("lead");
  await sets.approveFromReviews(name, "Checked the delay against the loop budget.");
  await sets.open(setId);
  await expect(sets.revision(1)).toHaveAttribute("data-state", "approved");
  await sets.promote(1, [CHANNEL]);
  await expect(sets.deployment(CHANNEL)).toHaveAttribute("data-state", "active", { timeout: 20_000 });
  await expect(sets.deployment(CHANNEL)).toContainText("Active");
  // Once the device has answered, nothing still says it is waiting.
  await expect(page.getByText(/waiting for the device/i)).toHaveCount(0);
  await expect(page.getByTestId("promote-form").getByRole("status")).toHaveText("The device has answered: the deployments on this page show what runs now.");

  const production = await page.request.get(`/api/v1/channels/${CHANNEL}/production`);
  expect(production.status()).toBe(200);
  expect(await production.json()).toMatchObject({ setId, revision: 1, setName: name, spec });

  // The channel's bench now runs the acknowledged revision as its production trace.
  const bench = new BenchPage(page);
  await bench.open(CHANNEL);
  await expect(page.getByText(`Production: ${name} revision 1`)).toBeVisible();
  await expect.poll(async () => (await bench.latest()).production, { timeout: 15_000 }).toEqual(expect.any(Number));
  const first = (await bench.latest()).production;
  await expect.poll(async () => (await bench.latest()).production, { timeout: 15_000 }).not.toBe(first);

  const operator = await browser.newPage();
  await new SignInPage(operator).signInAs("operator");
  await operator.goto(`/sets/${setId}`);
  await expect(operator.locator(`tr[data-channel="${CHANNEL}"]`).first()).toHaveAttribute("data-state", "active");
  await expect(operator.getByRole("button", { name: /Roll back|Promote|Approve|Submit/ })).toHaveCount(0);
  await operator.close();
});

test("an engineer may not approve, and a lead may not approve their own revision", async ({ page }) => {
  const signIn = new SignInPage(page);
  await signIn.signInAs("lead");
  const { revisionId } = await SetsPage.createThroughApi(page.request, { channel: CHANNEL, name: `E2E own ${Date.now().toString(36)}`, spec });
  const submit = await page.request.post(`/api/v1/revisions/${revisionId}/transitions`, { data: { action: "submit", expectedVersion: 1 }, headers: SAME_ORIGIN });
  expect(submit.status()).toBe(200);
  const own = await page.request.post(`/api/v1/revisions/${revisionId}/transitions`, { data: { action: "approve", expectedVersion: 2 }, headers: SAME_ORIGIN });
  expect(own.status()).toBe(403);
  expect((await own.json()).error.message).toMatch(/Four eyes/);
  await signIn.signOut();
  await signIn.signInAs("engineer");
  const engineer = await page.request.post(`/api/v1/revisions/${revisionId}/transitions`, { data: { action: "approve", expectedVersion: 2 }, headers: SAME_ORIGIN });
  expect(engineer.status()).toBe(403);
});
