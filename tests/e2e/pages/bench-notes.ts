import { expect, type Locator, type Page } from "@playwright/test";

/** The bench's strip of alarms and annotations under the live traces. */
export class BenchNotes {
  readonly strip: Locator;

  constructor(private readonly page: Page) {
    this.strip = page.getByRole("region", { name: "Alarms and annotations" });
  }

  /** Adds a note at the current moment and waits until it is listed. */
  async annotateNow(text: string): Promise<void> {
    await this.strip.getByRole("button", { name: "Now" }).click();
    await this.strip.getByLabel("Annotation text").fill(text);
    await this.strip.getByRole("button", { name: "Add annotation" }).click();
    await expect(this.strip.getByTestId("annotation").filter({ hasText: text })).toBeVisible();
  }
}
