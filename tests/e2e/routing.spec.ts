import { expect, test } from "@playwright/test";
import { SignInPage } from "./pages/sign-in-page";

test("unknown channels, sets, recordings and pages answer 404 with the app's own page", async ({ page }) => {
  await new SignInPage(page).signInAs("engineer");
  const cases: Array<[string, string]> = [
    ["/channels/no-such-rig/no-device/no-channel", "No such channel"],
    ["/loop/no-such-rig/no-device/no-channel", "No such channel"],
    ["/sets/9999", "No such coefficient set"],
    ["/recordings/9999", "No such recording"],
    ["/no-such-page", "Page not found"],
  ];
  for (const [path, title] of cases) {
    const res = await page.goto(path);
    expect(res?.status(), path).toBe(404);
    await expect(page.getByRole("heading", { name: title })).toBeVisible();
    await expect(page.getByRole("link", { name: "Back to the overview" })).toBeVisible();
  }
  await page.screenshot({ path: "test-results/routing-not-found.png" });
});

test("the chart speed check is for admins only in a production build", async ({ page }) => {
  await new SignInPage(page).signInAs("engineer");
  await page.goto("/channels/chart-bench");
  await expect(page).toHaveURL(/\/denied\?need=admin/);
  await page.context().clearCookies();
  await new SignInPage(page).signInAs("admin");
  await page.goto("/channels/chart-bench");
  await expect(page.getByRole("heading", { name: "Chart speed check" })).toBeVisible();
});
