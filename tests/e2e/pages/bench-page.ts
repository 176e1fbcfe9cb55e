import { expect, type Locator, type Page } from "@playwright/test";

/** The tuning bench of one channel as an engineer or operator uses it. */
export class BenchPage {
  readonly liveChart: Locator;
  readonly readout: Locator;
  readonly editor: Locator;

  constructor(private readonly page: Page) {
    this.liveChart = page.getByTestId("live-chart");
    this.readout = page.getByTestId("live-readout");
    this.editor = page.getByRole("complementary", { name: "Candidate editor" });
  }

  async open(channelPath: string): Promise<void> {
    await this.page.goto(`/channels/${channelPath}`);
    await expect(this.page.getByRole("region", { name: "Live traces" })).toBeVisible();
    await expect(this.page.getByTestId("link-state")).toHaveAttribute("data-link", "live", { timeout: 15_000 });
  }

  addCandidateButton(): Locator {
    return this.page.getByRole("button", { name: /Add candidate/ });
  }

  /** Adds a candidate (the editor opens on it) and returns its trace id. */
  async addCandidate(): Promise<string> {
    const before = await this.page.locator("[data-trace]").count();
    await this.addCandidateButton().click();
    await expect(this.editor).toBeVisible();
    const card = this.page.locator("[data-trace]").nth(before);
    return (await card.getAttribute("data-trace")) ?? "";
  }

  async chooseKind(label: string): Promise<void> {
    await this.editor.getByLabel("Kind of filter").selectOption({ label });
  }

  async setNumber(label: string, value: number): Promise<void> {
    await this.editor.getByLabel(label, { exact: false }).fill(String(value));
  }

  async closeEditor(): Promise<void> {
    await this.editor.getByRole("button", { name: "Close the editor" }).click();
    await expect(this.editor).toHaveCount(0);
  }

  async editCandidate(name: string): Promise<void> {
    await this.page.getByRole("button", { name: `Edit ${name}` }).click();
    await expect(this.editor).toBeVisible();
  }

  summary(traceId: string): Locator {
    return this.page.locator(`[data-trace="${traceId}"]`).getByTestId("candidate-summary");
  }

  /** The newest value of every trace, from the live readout's data-latest. */
  async latest(): Promise<Record<string, number | null>> {
    return JSON.parse((await this.readout.getAttribute("data-latest")) ?? "{}") as Record<string, number | null>;
  }

  /** Waits until a trace has a value, then until that value changes: the trace is live and moving. */
  async expectTraceMoving(traceId: string): Promise<void> {
    let first: number | null = null;
    await expect.poll(async () => (first = (await this.latest())[traceId] ?? null), { timeout: 15_000 }).not.toBeNull();
    await expect.poll(async () => (await this.latest())[traceId], { timeout: 10_000 }).not.toBe(first);
  }

  async showView(name: "Response" | "Delay" | "Poles" | "Step" | "Spectrum" | "Fixed point"): Promise<void> {
    await this.page.getByRole("tab", { name, exact: true }).click();
  }

  async saveAsNewSet(name: string, notes: string): Promise<Locator> {
    const save = this.editor.getByRole("region", { name: "Save" });
    await save.getByLabel("Set name").fill(name);
    await save.getByLabel("Notes").fill(notes);
    await save.getByRole("button", { name: "Save as a new set" }).click();
    return save;
  }
}
