import { expect, type Locator, type Page } from "@playwright/test";

/** The overview as an operator reads it: one card per channel with its live part and its alarm line. */
export class OverviewPage {
  constructor(private readonly page: Page) {}

  async open(): Promise<void> {
    await this.page.goto("/");
    await expect(this.page.getByRole("heading", { name: "Overview" })).toBeVisible();
  }

  card(path: string): Locator {
    return this.page.locator(`li[data-channel="${path}"]`);
  }

  alarmLine(path: string): Locator {
    return this.card(path).getByTestId("alarm-state");
  }

  async paths(): Promise<string[]> {
    return this.page.locator("li[data-channel]").evaluateAll((cards) => cards.map((c) => c.getAttribute("data-channel") ?? ""));
  }
}
