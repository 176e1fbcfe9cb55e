import { expect, test } from "@playwright/test";
import { BenchPage } from "./pages/bench-page";
import { SignInPage } from "./pages/sign-in-page";

// Needs the sidecar with the demo rig running (server/main.ts, DEMO=1) beside the web server.
const CHANNEL = "hydraulic-press/env-node/frame-strain";

test("an engineer tries a lowpass and a 50 Hz notch on the live stream and saves the notch", async ({ page }) => {
  await new SignInPage(page).signInAs("engineer");
  const bench = new BenchPage(page);
  await bench.open(CHANNEL);

  const lowpass = await bench.addCandidate();
  await expect(bench.summary(lowpass)).toHaveText("Butterworth LP 4 · 100 Hz");
  await bench.closeEditor();

  const notch = await bench.addCandidate();
  await bench.chooseKind("Biquad (cookbook)");
  await bench.editor.getByLabel("Shape").selectOption("notch");
  await bench.setNumber("Centre / corner", 50);
  await expect(bench.summary(notch)).toHaveText("Notch biquad · 50 Hz, Q 30");
  await expect(bench.editor.locator("[data-caution=notch]")).toContainText("49.17 Hz–50.83 Hz");

  await bench.expectTraceMoving(lowpass);
  await bench.expectTraceMoving(notch);

  const magnitude = page.getByTestId("bode-magnitude");
  await expect(magnitude.locator("canvas")).toBeVisible();
  expect((await magnitude.locator("canvas").boundingBox())?.width ?? 0).toBeGreaterThan(100);
  await bench.showView("Poles");
  const zPlane = page.getByTestId("pz-z");
  await expect(zPlane).toBeVisible();
  await expect(zPlane.locator("path")).not.toHaveCount(0);
  await expect(zPlane.locator("circle")).not.toHaveCount(1);

  const name = `Frame strain hum notch ${Date.now()}`;
  const save = await bench.saveAsNewSet(name, "50 Hz mains pickup, Q 30; tried live on the bench.");
  await expect(save.getByRole("status")).toContainText("Saved as revision 1", { timeout: 20_000 });
  await expect(save.getByRole("link", { name: "Open the set" })).toHaveAttribute("href", /^\/sets\/\d+$/);
});

test("an operator watches the live traces but finds no editor, no candidates and no save", async ({ page }) => {
  await new SignInPage(page).signInAs("operator");
  const bench = new BenchPage(page);
  await bench.open(CHANNEL);
  await expect(bench.liveChart.locator("canvas")).toBeVisible();
  await expect.poll(async () => (await bench.latest()).raw ?? null, { timeout: 15_000 }).not.toBeNull();
  await expect(bench.addCandidateButton()).toHaveCount(0);
  await expect(bench.editor).toHaveCount(0);
  await expect(page.getByRole("button", { name: /Save as/ })).toHaveCount(0);
  await expect(page.getByRole("button", { name: /^Notch at/ })).toHaveCount(0);
});
