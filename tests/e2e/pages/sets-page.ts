import { expect, type APIRequestContext, type Locator, type Page } from "@playwright/test";
import { SAME_ORIGIN } from "./origin";

/** The coefficient-set pages (/sets, /sets/[id], /reviews) as a person uses them. */
export class SetsPage {
  constructor(private readonly page: Page) {}

  /** Saves a new set through the API with the signed-in browser's session (the bench does the same). */
  static async createThroughApi(request: APIRequestContext, body: { channel: string; name: string; notes?: string; spec: unknown }) {
    const res = await request.post("/api/v1/sets", { data: body, headers: SAME_ORIGIN });
    expect(res.status(), await res.text()).toBe(201);
    return (await res.json()) as { setId: number; revisionId: number; revision: number };
  }

  async openList(): Promise<void> {
    await this.page.goto("/sets");
    await expect(this.page.getByRole("heading", { name: "Coefficient sets" })).toBeVisible();
  }

  async search(text: string): Promise<void> {
    await this.page.getByLabel("Search").fill(text);
  }

  row(setId: number): Locator {
    return this.page.getByTestId(`set-row-${setId}`);
  }

  async open(setId: number): Promise<void> {
    await this.page.goto(`/sets/${setId}`);
  }

  revision(n: number): Locator {
    return this.page.getByTestId(`revision-${n}`);
  }

  async submitForReview(n: number): Promise<void> {
    await this.revision(n).getByRole("button", { name: "Submit for review" }).click();
    await expect(this.revision(n)).toHaveAttribute("data-state", "in_review");
  }

  async approveFromReviews(setName: string, comment: string): Promise<void> {
    await this.page.goto("/reviews");
    const card = this.page.locator("article", { hasText: setName });
    await card.getByLabel("Approval comment").fill(comment);
    await card.getByRole("button", { name: "Approve" }).click();
    await expect(card).toHaveCount(0);
  }

  async promote(n: number, channels: string[]): Promise<void> {
    const form = this.revision(n).getByTestId("promote-form");
    for (const box of await form.getByRole("checkbox", { name: /\// }).all()) {
      const value = await box.getAttribute("value");
      if (value && channels.includes(value)) await box.check();
      else if (!(await box.isDisabled())) await box.uncheck();
    }
    await expect(form.getByRole("note")).toContainText("local codes and licensed engineers decide");
    await form.getByLabel(/I have read the cautions/).check();
    await form.getByRole("button", { name: "Promote" }).click();
    for (const channel of channels) await expect(this.deployment(channel)).toBeVisible({ timeout: 15_000 });
  }

  deployment(channel: string): Locator {
    return this.page.locator(`tr[data-channel="${channel}"]`).first();
  }
}
