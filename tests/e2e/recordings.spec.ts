import { expect, test, type Page } from "@playwright/test";
import { BenchPage } from "./pages/bench-page";
import { SignInPage } from "./pages/sign-in-page";

const CHANNEL = "gearbox-endurance/torque-node/input-torque";

/** Ten seconds at 1 kHz of a torque signal with 50 Hz pickup and a 240 Hz mesh tone, as t_s CSV. */
function torqueCsv(): string {
  const rows = ["t_s,torque[N·m]"];
  for (let i = 0; i < 10_000; i++) {
    const t = i / 1000;
    rows.push(`${t.toFixed(3)},${(10 + 2 * Math.sin(2 * Math.PI * 50 * t) + 0.5 * Math.sin(2 * Math.PI * 240 * t)).toFixed(6)}`);
  }
  return rows.join("\r\n") + "\r\n";
}

/** The recordings list with its upload form, and one recording's replay page. */
class RecordingsPage {
  constructor(private readonly page: Page) {}

  async upload(name: string, csv: string): Promise<void> {
    await this.page.goto("/recordings");
    await this.page.getByLabel("Channel").selectOption(CHANNEL);
    await this.page.getByLabel("CSV file").setInputFiles({ name: "torque.csv", mimeType: "text/csv", buffer: Buffer.from(csv) });
    await this.page.getByLabel("Name (optional)").fill(name);
    await this.page.getByRole("button", { name: "Upload recording" }).click();
  }

  traceChart() {
    return this.page.getByTestId("recording-chart");
  }

  peaks() {
    return this.page.getByTestId("recording-peaks");
  }
}

test("an engineer uploads a capture, sees its trace and spectrum, and overlays a candidate; an operator sees the trace only", async ({ page }) => {
  const name = `E2E capture ${Date.now().toString(36)}`;
  const signIn = new SignInPage(page);
  const recordings = new RecordingsPage(page);

  await signIn.signInAs("engineer");
  await recordings.upload(name, "t_s,torque[N·m]\n0,1\n0.002,1\n0.004,1\n");
  await expect(page.locator('[data-field-error="file"]')).toContainText("500 Hz");

  await recordings.upload(name, torqueCsv());
  await expect(page).toHaveURL(/\/recordings\/\d+$/);
  await expect(page.getByRole("heading", { name })).toBeVisible();
  await expect(recordings.traceChart().locator("canvas")).toBeVisible();
  await expect(recordings.peaks().getByText(/^50(\.\d+)? Hz$/)).toBeVisible();
  await expect(recordings.peaks().getByText(/^240(\.\d+)? Hz$/)).toBeVisible();
  await expect(page.getByRole("button", { name: "Try on the live bench" })).toBeVisible();

  await page.getByRole("button", { name: "Add candidate" }).click();
  await expect(page.getByTestId("candidate-0")).toBeVisible();
  await expect(recordings.traceChart()).toContainText("Candidate A");
  await expect(page.getByTestId("comparison-table")).toContainText("Candidate A");
  await page.getByRole("button", { name: "Close the editor" }).click();
  const url = page.url();
  await signIn.signOut();

  await signIn.signInAs("operator");
  await page.goto(url);
  await expect(recordings.traceChart().locator("canvas")).toBeVisible();
  await expect(page.getByRole("button", { name: "Add candidate" })).toHaveCount(0);
  await page.goto("/recordings");
  await expect(page.getByTestId("recordings-table")).toContainText(name);
  await expect(page.getByRole("button", { name: "Upload recording" })).toHaveCount(0);
});

test("an upload shows the bytes sent and can be cancelled; nothing is stored", async ({ page }) => {
  await new SignInPage(page).signInAs("engineer");
  // A slow uplink (about 1 MB/s) so the upload is still under way when the engineer cancels.
  const cdp = await page.context().newCDPSession(page);
  await cdp.send("Network.enable");
  await cdp.send("Network.emulateNetworkConditions", { offline: false, latency: 20, downloadThroughput: -1, uploadThroughput: 1_000_000 });
  const name = `Cancelled capture ${Date.now()}`;
  const csv = torqueCsv().repeat(16); // about 4 MB: the rows repeat, which is fine for a refused-or-cancelled upload
  await new RecordingsPage(page).upload(name, csv);
  const progress = page.getByTestId("upload-progress");
  await expect(progress).toContainText(/^[0-9.]+ of [0-9.]+ MB sent/);
  await expect.poll(async () => Number((await progress.textContent())?.split(" ")[0] ?? 0), { timeout: 10_000 }).toBeGreaterThan(0);
  await page.screenshot({ path: "test-results/recordings-upload-progress.png" });
  await page.getByRole("button", { name: "Cancel upload" }).click();
  await expect(page.getByText("Upload cancelled; nothing was stored.")).toBeVisible();
  await cdp.send("Network.emulateNetworkConditions", { offline: false, latency: 0, downloadThroughput: -1, uploadThroughput: -1 });
  await page.reload();
  await expect(page.getByTestId("recordings-table")).not.toContainText(name);
});

test("Try on the live bench carries the replay's candidates over to the engineer's bench", async ({ page }) => {
  test.setTimeout(90_000);
  const bench = new BenchPage(page);
  const recordings = new RecordingsPage(page);
  await new SignInPage(page).signInAs("engineer");
  await bench.open(CHANNEL); // starts from an empty bench
  await recordings.upload(`E2E carry-over ${Date.now().toString(36)}`, torqueCsv());
  await expect(page).toHaveURL(/\/recordings\/\d+$/);
  await page.getByRole("button", { name: "Add candidate" }).click();
  await page.getByRole("textbox", { name: /^Cutoff/ }).fill("130");
  await expect(page.getByTestId("candidate-0").getByTestId("candidate-summary")).toHaveText("Butterworth LP 4 · 130 Hz");
  await page.getByRole("button", { name: "Close the editor" }).click();

  await page.getByRole("button", { name: "Try on the live bench (1 candidate)" }).click();
  await expect(page).toHaveURL(new RegExp(`/channels/${CHANNEL}$`));
  await expect(bench.candidateSummaries()).toHaveText(["Butterworth LP 4 · 130 Hz"]);
  // It runs on the stream too, not only on the card.
  await expect(page.getByTestId("live-chart")).toContainText("Candidate A");
  await bench.removeKeptCandidates();
});
