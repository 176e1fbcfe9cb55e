import { expect, test } from "@playwright/test";
import { LoopCheckPage } from "./pages/loop-check-page";
import { SignInPage } from "./pages/sign-in-page";

const CHANNEL = "hydraulic-press/press-ctl/ram-position";
/** A number with a unit, as the margins table prints it (e.g. "52.6 °", "36 dB", "8.819 Hz"). */
const numberWith = (unit: string) => new RegExp(`−?\\d+(\\.\\d+)? ${unit}`);

/** The first number in a cell's text (the table writes − for minus). */
function firstNumber(text: string): number {
  const match = text.replace("−", "-").match(/-?\d+(\.\d+)?/);
  if (!match) throw new Error(`no number in "${text}"`);
  return Number(match[0]);
}

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

  // The phase cost: a 2nd-order Butterworth with corner fc0 lags atan(√2·x/(1 − x²)) at x = f/fc0 (its analog
  // closed form, H(s) = 1/(s² + √2·s + 1); S. Butterworth, "On the Theory of Filter Amplifiers", 1930), about 18°
  // at the loop's ~9 Hz crossover. At fs = 2 kHz the prewarped digital design is within a few hundredths of a degree.
  const fc = firstNumber(await loop.marginsRow("without").locator("td").nth(3).innerText());
  const x = fc / 40;
  const expectedLag = (Math.atan2(Math.SQRT2 * x, 1 - x * x) * 180) / Math.PI;
  const change = await page.getByTestId("margins-change").innerText();
  const lagDeg = firstNumber(change.slice(change.indexOf("filter lag at fc")));
  expect(Math.abs(lagDeg - expectedLag)).toBeLessThan(0.1);
  // It comes off the phase margin one for one (the filter's |F| ≈ 1 there barely moves the crossover).
  const pmWithout = firstNumber(await loop.marginsRow("without").locator("td").nth(2).innerText());
  const pmWith = firstNumber(await loop.marginsRow("with").locator("td").nth(2).innerText());
  expect(Math.abs(pmWithout - pmWith - lagDeg)).toBeLessThan(0.5);

  // The caution names that lag and defers to review.
  const lag = page.locator("[data-caution=lag]");
  await expect(lag).toContainText(`${change.match(/filter lag at fc: (\S+ °)/)?.[1]} of lag at the crossover`);
  await expect(lag).toContainText("local codes and licensed engineers decide");
});

test("an operator is refused the loop check", async ({ page }) => {
  await new SignInPage(page).signInAs("operator");
  await page.goto(`/loop/${CHANNEL}`);
  await expect(page).toHaveURL(/\/denied\?need=engineer/);
  await expect(page.locator("main [role=alert]")).toContainText("needs the engineer role");
});
