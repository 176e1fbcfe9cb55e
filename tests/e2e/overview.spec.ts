import { expect, test, type Locator, type Page } from "@playwright/test";
import { DEMO_RIGS } from "@/lib/demo/lab";
import { SignInPage } from "./pages/sign-in-page";

/** The overview as an operator reads it: one card per channel with its live part. */
class OverviewPage {
  constructor(private readonly page: Page) {}

  async open(): Promise<void> {
    await this.page.goto("/");
    await expect(this.page.getByRole("heading", { name: "Overview" })).toBeVisible();
  }

  card(path: string): Locator {
    return this.page.locator(`li[data-channel="${path}"]`);
  }

  async paths(): Promise<string[]> {
    return this.page.locator("li[data-channel]").evaluateAll((cards) => cards.map((c) => c.getAttribute("data-channel") ?? ""));
  }
}

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
    await expect(card.getByTestId("alarm-state")).toHaveText("alarms: none configured");
  }
});

test("the live overview API refuses a visitor who is not signed in", async ({ request }) => {
  const res = await request.get("/api/v1/live/overview");
  expect(res.status()).toBe(401);
  expect((await res.json()).error.code).toBe("unauthorized");
});
