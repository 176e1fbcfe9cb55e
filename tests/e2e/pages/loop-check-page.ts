import { expect, type Locator, type Page } from "@playwright/test";

/** The loop check of one channel as an engineer uses it. */
export class LoopCheckPage {
  constructor(private readonly page: Page) {}

  async open(path: string): Promise<void> {
    await this.page.goto(`/loop/${path}`);
  }

  heading(): Locator {
    return this.page.getByRole("heading", { name: /^Loop check/ });
  }

  /** Types a classic IIR filter into the form (source "Type a filter"). */
  async typeIir(opts: { family: string; response: string; order: number; cutoffHz: number }): Promise<void> {
    await this.page.getByRole("radio", { name: "Type a filter" }).click();
    await this.page.getByLabel("Kind of stage 1", { exact: true }).selectOption("iir");
    await this.page.getByLabel("Family", { exact: true }).selectOption(opts.family);
    await this.page.getByLabel("Response", { exact: true }).selectOption(opts.response);
    await this.page.getByLabel("Order", { exact: true }).fill(String(opts.order));
    await this.page.getByLabel(/^Cutoff/).fill(String(opts.cutoffHz));
  }

  filterStatus(): Locator {
    return this.page.getByTestId("loop-filter-status");
  }

  marginsRow(which: "with" | "without"): Locator {
    return this.page.getByTestId(`margins-${which}`);
  }

  async expectPlotsDrawn(): Promise<void> {
    for (const id of ["loop-bode-magnitude", "loop-bode-phase", "loop-step"]) {
      await expect(this.page.getByTestId(id).locator("canvas")).toHaveCount(1);
    }
    await expect(this.page.getByTestId("locus-without").locator("circle").first()).toBeVisible();
    await expect(this.page.getByTestId("locus-with").locator("circle").first()).toBeVisible();
  }
}
