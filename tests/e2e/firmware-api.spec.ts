import { expect, test } from "@playwright/test";
import { BenchPage } from "./pages/bench-page";
import { SignInPage } from "./pages/sign-in-page";

// Torque node (gearbox-endurance) runs Q15 coefficients in the demo lab.
const Q15_CHANNEL = "gearbox-endurance/torque-node/input-torque";

test("the API page renders the OpenAPI document with the firmware build example", async ({ page }) => {
  await new SignInPage(page).signInAs("operator");
  await page.getByRole("link", { name: "API", exact: true }).click();
  await expect(page.getByRole("heading", { name: "HTTP API" })).toBeVisible();
  const example = page.getByTestId("api-worked-example");
  await expect(example.getByTestId("api-make-rule")).toContainText("production/export?format=cmsis-df1&prefix=ram_position");
  await expect(example).toContainText('curl -fsS --retry 3 -H "Authorization: Bearer $TAPWRIGHT_TOKEN"');
  const op = page.getByTestId("api-op-promoteRevision");
  await expect(op).toContainText("/api/v1/revisions/{id}/promote");
  await expect(op).toContainText("session cookie or Bearer token");
  await expect(page.getByTestId("api-op-exportRevision")).toContainText("cmsis-df1 | cmsis-df2t");
  await page.screenshot({ path: "/tmp/tw-api-page.png" });
  await page.getByTestId("api-tag-exports").screenshot({ path: "/tmp/tw-api-exports.png" });
  const doc = await page.request.get("/api/v1/openapi.json");
  expect(doc.status()).toBe(200);
  expect((await doc.json()).openapi).toBe("3.1.0");
});

test("a lead creates a promote token and sees its scope; an engineer is offered read only", async ({ page }) => {
  await new SignInPage(page).signInAs("lead");
  await page.getByRole("link", { name: "API tokens" }).click();
  const name = `e2e release pipeline ${Date.now()}`;
  await page.getByLabel("Name (what uses it)").fill(name);
  await page.getByRole("radio", { name: /promote/ }).check();
  await page.getByRole("button", { name: "Create token" }).click();
  await expect(page.getByTestId("new-token-value")).toHaveText(/^tw_[A-Za-z0-9_-]{43}$/);
  const row = page.getByTestId("token-list").getByRole("row").filter({ hasText: name });
  await expect(row.getByTestId("token-scope")).toHaveText("promote");
  await page.screenshot({ path: "/tmp/tw-tokens.png" });
  await new SignInPage(page).signOut();
  await new SignInPage(page).signInAs("engineer");
  await page.goto("/tokens");
  await expect(page.getByRole("radio", { name: /read/ })).toBeChecked();
  await expect(page.getByRole("radio", { name: /promote/ })).toHaveCount(0);
});

test("the fixed-point view says which arithmetic it shows and compares it with the float design", async ({ page }) => {
  await new SignInPage(page).signInAs("engineer");
  const bench = new BenchPage(page);
  await bench.open(Q15_CHANNEL);
  await bench.addCandidate();
  await bench.showView("Fixed point");
  const panel = page.getByTestId("fixed-arithmetic");
  await expect(panel.getByTestId("fixed-arithmetic-label")).toHaveText(/^Arithmetic shown: Tapwright Q15: DF1, 64-bit accumulator, rounded to nearest, saturated\.$/);
  await panel.getByRole("combobox").selectOption({ label: "CMSIS-DSP fast kernels" });
  await expect(panel.getByTestId("fixed-arithmetic-label")).toContainText("CMSIS-DSP arm_biquad_cascade_df1_fast_q15 / arm_fir_fast_q15");
  await expect(panel).toContainText(/worst -\d+\.\d dBFS/);
  await panel.scrollIntoViewIfNeeded();
  await page.screenshot({ path: "/tmp/tw-fixed-point.png" });
});
