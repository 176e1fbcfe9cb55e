import { expect, test } from "@playwright/test";
import { AlarmsPage } from "./pages/alarms-page";
import { SignInPage } from "./pages/sign-in-page";

// A browser five hours behind UTC: what is typed and what is listed are both UTC, as every time in the app.
test.use({ timezoneId: "America/New_York" });

test("an annotation typed at a UTC time is listed at that time by a browser in another zone", async ({ page }) => {
  await new SignInPage(page).signInAs("operator");
  const alarms = new AlarmsPage(page);
  await alarms.open();
  expect(await page.evaluate(() => new Date(Date.UTC(2026, 11, 3, 10)).getHours())).toBe(5);

  const note = `Valve swap at a typed time ${Date.now().toString(36)}`;
  const form = page.getByRole("form", { name: "Add an annotation" });
  await form.getByLabel("Annotation text").fill(note);
  await form.getByLabel("At (UTC)").fill("2026-12-03T10:15:30");
  await form.getByRole("button", { name: "Add annotation" }).click();
  await expect(form.getByRole("status")).toHaveText("Annotation saved.");

  const found = await alarms.searchAnnotations(note.split(" ").slice(-1)[0]);
  await expect(found).toHaveCount(1);
  await expect(found).toContainText("2026-12-03 10:15:30 UTC");
});
