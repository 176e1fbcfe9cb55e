import { expect, type Page } from "@playwright/test";

export const DEMO_PASSWORD = process.env.DEMO_PASSWORD ?? "tapwright-demo";

/** The sign-in screen as a person uses it. */
export class SignInPage {
  constructor(private readonly page: Page) {}

  async signIn(email: string, password = DEMO_PASSWORD): Promise<void> {
    await this.page.goto("/sign-in");
    await this.page.getByLabel("E-mail").fill(email);
    await this.page.getByLabel("Password").fill(password);
    await this.page.getByRole("button", { name: "Sign in" }).click();
  }

  async signInAs(role: "operator" | "engineer" | "lead" | "admin"): Promise<void> {
    await this.signIn(`${role}@tapwright.test`);
    await expect(this.page.getByTestId("who")).toContainText(role);
  }

  async signOut(): Promise<void> {
    await this.page.getByRole("button", { name: "Sign out" }).click();
    await expect(this.page).toHaveURL(/\/sign-in$/);
  }
}
