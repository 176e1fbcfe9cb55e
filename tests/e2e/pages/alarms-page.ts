import { expect, type Locator, type Page } from "@playwright/test";

/** The Alarms page as an operator uses it: active alarms, acknowledgement, annotation search. */
export class AlarmsPage {
  readonly active: Locator;
  readonly history: Locator;

  constructor(private readonly page: Page) {
    this.active = page.getByRole("list", { name: "Active alarms" });
    this.history = page.getByRole("list", { name: "Alarm history" });
  }

  async open(query = ""): Promise<void> {
    await this.page.goto(`/alarms${query}`);
    await expect(this.page.getByRole("heading", { name: "Alarms", exact: true })).toBeVisible();
    await expect(this.page.getByTestId("alarm-link")).toHaveAttribute("data-link", "live", { timeout: 15_000 });
  }

  activeEvent(ruleName: string): Locator {
    return this.active.getByTestId("alarm-event").filter({ hasText: ruleName });
  }

  async acknowledge(event: Locator, comment: string): Promise<void> {
    await event.getByRole("button", { name: "Acknowledge…" }).click();
    await event.getByLabel("Acknowledgement comment").fill(comment);
    await event.getByRole("button", { name: "Acknowledge", exact: true }).click();
  }

  async searchAnnotations(text: string): Promise<Locator> {
    await this.page.getByLabel("Search annotations").fill(text);
    return this.page.getByRole("region", { name: "Annotations" }).getByTestId("annotation");
  }
}
