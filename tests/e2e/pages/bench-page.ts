import { expect, type Locator, type Page, type Response } from "@playwright/test";

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

  /**
   * Opens the bench. The engineer's candidates are kept per channel between visits, so unless
   * `keepCandidates` is set the ones an earlier test left are removed first (and forgotten by the
   * server), for a bench that starts empty.
   */
  async open(channelPath: string, opts: { keepCandidates?: boolean } = {}): Promise<void> {
    await this.page.goto(`/channels/${channelPath}`);
    await expect(this.page.getByRole("region", { name: "Live traces" })).toBeVisible();
    await expect(this.page.getByTestId("link-state")).toHaveAttribute("data-link", "live", { timeout: 15_000 });
    if (!opts.keepCandidates) await this.removeKeptCandidates();
  }

  /** Removes every candidate on the bench and waits (at most 15 s) until the server has forgotten each one. */
  async removeKeptCandidates(): Promise<void> {
    const remove = this.page.getByRole("button", { name: /^Remove Candidate [A-F]$/ });
    const count = await remove.count();
    if (count === 0) return;
    let forgotten = 0;
    const seen = (r: Response) => {
      if (r.request().method() === "DELETE" && r.url().includes("/candidates/")) forgotten++;
    };
    this.page.on("response", seen);
    try {
      while ((await remove.count()) > 0) await remove.first().click();
      await expect.poll(() => forgotten, { timeout: 15_000, message: `the server forgets the ${count} removed candidates` }).toBeGreaterThanOrEqual(count);
    } finally {
      this.page.off("response", seen);
    }
  }

  /** The candidate cards shown, as their summaries in order. */
  candidateSummaries(): Locator {
    return this.page.getByRole("region", { name: "Candidates" }).getByTestId("candidate-summary");
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

  /** Picks the design kind of an open stage (1-based; a new candidate has stage 1 open). */
  async chooseKind(label: string, stage = 1): Promise<void> {
    await this.editor.getByLabel(`Kind of stage ${stage}`).selectOption({ label });
  }

  /** The candidate's stages in the editor, in running order. */
  stages(): Locator {
    return this.editor.getByRole("region", { name: "Stages" }).getByRole("listitem");
  }

  /** Adds a stage of a kind at the end of the chain being edited. */
  async addStage(kindLabel: string): Promise<void> {
    await this.editor.getByLabel("New stage").selectOption({ label: kindLabel });
    await this.editor.getByRole("button", { name: "Add stage" }).click();
  }

  /** The live spectrum of the raw signal, at the top of the bench. */
  liveSpectrum(): Locator {
    return this.page.getByRole("region", { name: "Live spectrum" });
  }

  /** The analysis area's spectrum of every shown trace. */
  shownSpectrum(): Locator {
    return this.page.getByRole("region", { name: "Spectrum of the shown traces" });
  }

  /** What a spectrum panel lists now: each peak's frequency and every shown trace's level there in dB. */
  async peaks(panel: Locator): Promise<{ hz: number; levels: Record<string, number | null> }[]> {
    return panel
      .getByTestId("spectrum-peaks")
      .locator("li")
      .evaluateAll((els) => els.map((e) => ({ hz: Number(e.getAttribute("data-hz")), levels: JSON.parse(e.getAttribute("data-levels") ?? "{}") as Record<string, number | null> })));
  }

  /** Holds a spectrum panel (its peaks stop moving) once it lists a peak near each frequency, within 1 Hz. */
  async holdWithPeaksNear(panel: Locator, freqsHz: number[]): Promise<void> {
    const near = (listed: { hz: number }[]) => freqsHz.every((f) => listed.some((p) => Math.abs(p.hz - f) <= 1));
    await expect.poll(async () => near(await this.peaks(panel)), { timeout: 20_000, message: `peaks near ${freqsHz.join(", ")} Hz` }).toBe(true);
    await panel.getByRole("button", { name: "Hold" }).click();
    expect(near(await this.peaks(panel)), "the held spectrum still shows the peaks").toBe(true);
  }

  /** Clicks "Notch" on a held panel's peak within 1 Hz of freqHz; returns the frequency as the button names it, e.g. "49.99 Hz". */
  async notchPeakNear(panel: Locator, freqHz: number): Promise<string> {
    const peak = (await this.peaks(panel)).find((p) => Math.abs(p.hz - freqHz) <= 1);
    expect(peak, `a peak near ${freqHz} Hz`).toBeDefined();
    const button = panel.locator(`li[data-hz="${peak?.hz}"]`).getByRole("button", { name: /^Notch at/ });
    const named = ((await button.getAttribute("aria-label")) ?? "").replace(/^Notch at /, "");
    await button.click();
    return named;
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

  /** The live traces' controls: time window and pause. */
  async setWindow(seconds: number): Promise<void> {
    await this.page.getByLabel("Time window").selectOption(String(seconds));
  }

  async pause(): Promise<void> {
    await this.page.getByRole("region", { name: "Live traces" }).getByRole("button", { name: "Pause" }).click();
  }

  /** Drags across a chart's plot area from one fraction of its width to another (a drag-zoom). */
  async dragZoom(chart: Locator, fromFraction: number, toFraction: number): Promise<void> {
    const box = await chart.locator(".u-over").boundingBox();
    if (!box) throw new Error("the chart has no plot area");
    const y = box.y + box.height / 2;
    await this.page.mouse.move(box.x + box.width * fromFraction, y);
    await this.page.mouse.down();
    await this.page.mouse.move(box.x + box.width * ((fromFraction + toFraction) / 2), y, { steps: 4 });
    await this.page.mouse.move(box.x + box.width * toFraction, y, { steps: 4 });
    await this.page.mouse.up();
  }

  /**
   * Opaque bright pixels of a chart's plot area (the drawn traces; the grid is translucent): 0 means the plot is blank.
   * Read from the canvas inside the plot area only, so axis labels do not count.
   */
  async plottedPixels(chart: Locator): Promise<number> {
    return chart.evaluate((host) => {
      const canvas = host.querySelector("canvas");
      const over = host.querySelector(".u-over");
      const ctx = canvas?.getContext("2d");
      if (!canvas || !over || !ctx) return 0;
      const c = canvas.getBoundingClientRect();
      const o = over.getBoundingClientRect();
      const k = canvas.width / c.width;
      const img = ctx.getImageData(Math.round((o.left - c.left) * k), Math.round((o.top - c.top) * k), Math.round(o.width * k), Math.round(o.height * k));
      let bright = 0;
      for (let i = 0; i < img.data.length; i += 4) if (Math.max(img.data[i], img.data[i + 1], img.data[i + 2]) > 110 && img.data[i + 3] > 160) bright++;
      return bright;
    });
  }
}
