import { expect, test } from "@playwright/test";
import { LoopCheckPage } from "./pages/loop-check-page";
import { SignInPage } from "./pages/sign-in-page";

const CHANNEL = "hydraulic-press/press-ctl/ram-position";
/** A number with a unit, as the margins table prints it (e.g. "52.6 °", "36 dB", "8.819 Hz"). */
const numberWith = (unit: string) => new RegExp(`−?\\d+(\\.\\d+)? ${unit}`);

test("an engineer types a Butterworth low-pass and compares the loop with and without it", async ({ page }) => {
  await new SignInPage(page).signInAs("engineer");
  const loop = new LoopCheckPage(page);
  await loop.open(CHANNEL);
  await expect(loop.heading()).toBeVisible();

  await loop.typeIir({ family: "butterworth", response: "lowpass", order: 2, cutoffHz: 40 });
  await expect(loop.filterStatus()).toContainText("Typed: Butterworth LP 2 · 40 Hz");

  for (const which of ["without", "with"] as const) {
    const row = loop.marginsRow(which);
    await expect(row).toBeVisible();
    await expect(row.locator("td").nth(0)).toHaveText(numberWith("dB"));
    await expect(row.locator("td").nth(2)).toHaveText(numberWith("°"));
    await expect(row.locator("td").nth(3)).toHaveText(numberWith("Hz"));
    await expect(row.locator("td").nth(4)).toHaveText(numberWith("ms"));
  }
  await expect(page.getByTestId("margins-change")).toContainText("filter lag at fc");
  await loop.expectPlotsDrawn();
  // A 40 Hz second-order low-pass costs about 20° at the ~9 Hz crossover: the caution says so and defers to review.
  const lag = page.locator("[data-caution=lag]");
  await expect(lag).toContainText("of lag at the crossover");
  await expect(lag).toContainText("local codes and licensed engineers decide");
});

test("an operator is refused the loop check", async ({ page }) => {
  await new SignInPage(page).signInAs("operator");
  await page.goto(`/loop/${CHANNEL}`);
  await expect(page).toHaveURL(/\/denied\?need=engineer/);
  await expect(page.locator("main [role=alert]")).toContainText("needs the engineer role");
});
