import { expect, test, type Page } from "@playwright/test";
import { SAME_ORIGIN } from "./pages/origin";
import { DEMO_PASSWORD } from "./pages/sign-in-page";

/** Signs in through the API (the sign-in form has its own tests), sharing the cookie with the page. */
async function signInAs(page: Page, role: "operator" | "engineer"): Promise<void> {
  const res = await page.request.post("/api/auth/login", { data: { email: `${role}@tapwright.test`, password: DEMO_PASSWORD }, headers: SAME_ORIGIN });
  expect(res.status()).toBe(200);
}

/** The API tokens page as an engineer uses it. */
class TokensPage {
  constructor(private readonly page: Page) {}

  async open(): Promise<void> {
    await this.page.getByRole("link", { name: "API tokens" }).click();
    await expect(this.page.getByRole("heading", { name: "API tokens" })).toBeVisible();
  }

  /** Creates a token and returns the text the page shows once. */
  async create(name: string): Promise<string> {
    await this.page.getByLabel("Name (what uses it)").fill(name);
    await this.page.getByRole("button", { name: "Create token" }).click();
    const value = this.page.getByTestId("new-token-value");
    await expect(value).toHaveText(/^tw_[A-Za-z0-9_-]{43}$/);
    return (await value.textContent()) ?? "";
  }

  row(name: string) {
    return this.page.getByTestId("token-list").getByRole("row").filter({ hasText: name });
  }
}

test("an engineer creates a token, sees it once, exports with it, and revokes it", async ({ page }) => {
  await signInAs(page, "engineer");
  const created = await page.request.post("/api/v1/sets", {
    headers: SAME_ORIGIN,
    data: { channel: "gearbox-endurance/torque-node/input-torque", name: "E2E export LP", spec: { kind: "iir", family: "butterworth", response: "lowpass", order: 2, cutoffHz: 100, sampleRateHz: 1000 } },
  });
  expect(created.status()).toBe(201);
  const { setId, revisionId } = await created.json();

  await page.goto(`/sets/${setId}`);
  const control = page.getByTestId(`export-${revisionId}`);
  await control.getByLabel("Export format").selectOption("json");
  await expect(control.getByRole("link", { name: "Download" })).toHaveAttribute("href", `/api/v1/revisions/${revisionId}/export?format=json&target=q15`);

  const tokens = new TokensPage(page);
  await tokens.open();
  const token = await tokens.create("e2e pipeline");
  await expect(tokens.row("e2e pipeline")).toBeVisible();

  const bearer = { headers: { authorization: `Bearer ${token}`, cookie: "" } };
  const exported = await page.request.get(`/api/v1/revisions/${revisionId}/export?format=c-header`, bearer);
  expect(exported.status()).toBe(200);
  expect(await exported.text()).toContain("#define E2E_EXPORT_LP_R1_Q15_SECTIONS 1");

  await page.reload();
  await expect(page.getByTestId("new-token-value")).toHaveCount(0);
  await expect(page.getByText(token)).toHaveCount(0);

  // Revoking asks first; Cancel leaves the token working.
  await tokens.row("e2e pipeline").getByRole("button", { name: "Revoke" }).click();
  await expect(tokens.row("e2e pipeline").getByRole("alertdialog")).toContainText("stops working at once");
  await tokens.row("e2e pipeline").getByRole("button", { name: "Cancel" }).click();
  expect((await page.request.get(`/api/v1/revisions/${revisionId}/export?format=json`, bearer)).status()).toBe(200);
  await tokens.row("e2e pipeline").getByRole("button", { name: "Revoke" }).click();
  await tokens.row("e2e pipeline").getByRole("button", { name: "Yes, revoke" }).click();
  await expect(tokens.row("e2e pipeline")).toContainText("revoked");
  expect((await page.request.get(`/api/v1/revisions/${revisionId}/export?format=json`, bearer)).status()).toBe(401);
});

test("an operator has no tokens page", async ({ page }) => {
  await signInAs(page, "operator");
  await page.goto("/sets");
  await expect(page.getByTestId("who")).toContainText("operator");
  await expect(page.getByRole("link", { name: "API tokens" })).toHaveCount(0);
  await page.goto("/tokens");
  await expect(page).toHaveURL(/\/denied\?need=engineer/);
});
