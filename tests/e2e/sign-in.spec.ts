import { expect, test } from "@playwright/test";
import { SignInPage } from "./pages/sign-in-page";

const ROLES = ["operator", "engineer", "lead", "admin"] as const;

for (const role of ROLES) {
  test(`${role} signs in, sees the lab and signs out`, async ({ page }) => {
    const signIn = new SignInPage(page);
    await signIn.signInAs(role);
    await expect(page.getByRole("heading", { name: "Overview" })).toBeVisible();
    await expect(page.getByRole("region", { name: "Gearbox endurance rig" })).toBeVisible();
    const usersLink = page.getByRole("link", { name: "Users" });
    if (role === "admin") await expect(usersLink).toBeVisible();
    else await expect(usersLink).toHaveCount(0);
    await signIn.signOut();
  });
}

test("an operator is refused the admin page", async ({ page }) => {
  await new SignInPage(page).signInAs("operator");
  await page.goto("/admin/users");
  await expect(page).toHaveURL(/\/denied\?need=admin/);
  await expect(page.locator("main [role=alert]")).toContainText("needs the admin role");
});

test("an admin sees the user list", async ({ page }) => {
  await new SignInPage(page).signInAs("admin");
  await page.goto("/admin/users");
  await expect(page.getByRole("heading", { name: "Users" })).toBeVisible();
  await expect(page.getByTestId("user-operator@tapwright.test")).toBeVisible();
});

test("a wrong password gets one generic message", async ({ page }) => {
  await new SignInPage(page).signIn("engineer@tapwright.test", "not-the-password");
  await expect(page.locator("form [role=alert]")).toHaveText("E-mail or password is not right.");
});

test("pages and the API refuse visitors without a session", async ({ page, request }) => {
  await page.goto("/");
  await expect(page).toHaveURL(/\/sign-in$/);
  expect((await request.get("/api/v1/channels")).status()).toBe(401);
  expect((await request.get("/api/auth/me")).status()).toBe(401);
});
