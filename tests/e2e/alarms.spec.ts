import { expect, test, type APIRequest, type APIRequestContext } from "@playwright/test";
import { AlarmsPage } from "./pages/alarms-page";
import { BenchNotes } from "./pages/bench-notes";
import { BenchPage } from "./pages/bench-page";
import { OverviewPage } from "./pages/overview-page";
import { SAME_ORIGIN } from "./pages/origin";
import { DEMO_PASSWORD, SignInPage } from "./pages/sign-in-page";

const AMBIENT = "hydraulic-press/env-node/ambient-temp"; // about 21.5 °C in the demo
const RULE = `Ambient above 10 °C ${Date.now().toString(36)}`;

/** An engineer's API session, as a script or another browser would hold it. */
async function engineerApi(request: APIRequest, baseURL: string | undefined): Promise<APIRequestContext> {
  const api = await request.newContext({ baseURL, extraHTTPHeaders: SAME_ORIGIN });
  expect((await api.post("/api/auth/login", { data: { email: "engineer@tapwright.test", password: DEMO_PASSWORD } })).status()).toBe(200);
  return api;
}

test("an operator sees an alarm appear on the overview without a reload, acknowledges it, then annotates the bench and finds the note", async ({ page, playwright, baseURL }) => {
  const engineer = await engineerApi(playwright.request, baseURL);
  await new SignInPage(page).signInAs("operator");
  const overview = new OverviewPage(page);
  await overview.open();
  await expect(overview.alarmLine(AMBIENT)).toHaveText("alarms: none configured");
  await page.evaluate(() => Object.assign(window, { keptSinceLoad: true }));

  // An engineer adds a rule elsewhere; the ambient temperature is above its limit at once.
  const created = await engineer.post("/api/v1/alarm-rules", {
    data: { channel: AMBIENT, name: RULE, signal: "raw", high: 10, deadband: 1, minDurationMs: 0, severity: "critical" },
  });
  expect(created.status()).toBe(201);
  const rule = await created.json();

  const line = overview.alarmLine(AMBIENT);
  await expect(line).toHaveAttribute("data-alarm", "raised", { timeout: 15_000 });
  await expect(line).toContainText(`1 raised · 1 to acknowledge · critical: ${RULE}`);
  expect(await page.evaluate(() => "keptSinceLoad" in window)).toBe(true); // the same page: no reload

  const alarms = new AlarmsPage(page);
  await alarms.open(`?channel=${AMBIENT}`);
  const event = alarms.activeEvent(RULE);
  await expect(event).toHaveAttribute("data-state", "raised");
  await alarms.acknowledge(event, "Probe reads room air; limit set for the test. Checked by hand.");
  await expect(event.getByTestId("acknowledgement")).toContainText("Acknowledged by Demo Operator");
  await expect(event.getByTestId("acknowledgement")).toContainText("Probe reads room air; limit set for the test. Checked by hand.");

  const bench = new BenchPage(page);
  await bench.open(AMBIENT);
  const note = `Swapped the ambient probe ${Date.now().toString(36)}`;
  await new BenchNotes(page).annotateNow(note);

  await alarms.open();
  const found = await alarms.searchAnnotations(note.split(" ").slice(1, 4).join(" ").toUpperCase());
  await expect(found).toHaveCount(1);
  await expect(found).toContainText(note);
  await expect(found).toContainText(AMBIENT);

  // Leave the lab as it was for the other tests: the rule goes, its alarm stays in the history.
  expect((await engineer.delete(`/api/v1/alarm-rules/${rule.id}`)).status()).toBe(204);
  await engineer.dispose();
});

test("an operator may not create alarm rules", async ({ page }) => {
  await new SignInPage(page).signInAs("operator");
  const refused = await page.request.post("/api/v1/alarm-rules", {
    data: { channel: AMBIENT, name: "not mine to add", signal: "raw", high: 10, deadband: 0, minDurationMs: 0, severity: "advisory" },
    headers: SAME_ORIGIN,
  });
  expect(refused.status()).toBe(403);
  expect((await refused.json()).error.message).toBe("This needs the engineer role or higher.");
  await new AlarmsPage(page).open();
  await expect(page.getByRole("button", { name: "Add a rule" })).toHaveCount(0);
});
