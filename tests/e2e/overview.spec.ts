import { expect, test } from "@playwright/test";
import { DEMO_ALARM_RULES, DEMO_RIGS } from "@/lib/demo/lab";
import { OverviewPage } from "./pages/overview-page";
import { SignInPage } from "./pages/sign-in-page";

const DEMO_PATHS = DEMO_RIGS.flatMap((rig) => rig.devices.flatMap((d) => d.channels.map((c) => `${rig.key}/${d.key}/${c.key}`)));

test("an operator sees every demo channel online, with a recent sample and a sparkline", async ({ page }) => {
  await new SignInPage(page).signInAs("operator");
  const overview = new OverviewPage(page);
  await overview.open();
  expect((await overview.paths()).sort()).toEqual([...DEMO_PATHS].sort());
  for (const path of DEMO_PATHS) {
    const card = overview.card(path);
    await expect(card.getByTestId("device-state")).toHaveText("online", { timeout: 10_000 });
    await expect(card.getByTestId("sparkline")).toBeVisible();
    await expect(card.getByTestId("sample-age")).toHaveText(/^\d+\.\d s ago$/);
    if (DEMO_ALARM_RULES.some((r) => r.channel === path)) await expect(overview.alarmLine(path)).not.toHaveAttribute("data-alarm", "none");
    else await expect(overview.alarmLine(path)).toHaveText("alarms: none configured");
  }
});

test("the live overview API refuses a visitor who is not signed in", async ({ request }) => {
  const res = await request.get("/api/v1/live/overview");
  expect(res.status()).toBe(401);
  expect((await res.json()).error.code).toBe("unauthorized");
});
