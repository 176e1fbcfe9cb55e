import { expect, test } from "@playwright/test";
import { BenchPage } from "./pages/bench-page";
import { SignInPage } from "./pages/sign-in-page";

// Needs the sidecar with the demo rig running (server/main.ts, DEMO=1) beside the web server.
const CHANNEL = "hydraulic-press/env-node/frame-strain"; // 1 kHz

test("an engineer designs a bandwidth-Q notch, a comb and an equiripple FIR, and sees a long FIR's zeros", async ({ page }) => {
  // Four designs analysed in the browser, then the roots of a 1023-tap FIR in a worker.
  test.setTimeout(120_000);
  await new SignInPage(page).signInAs("engineer");
  const bench = new BenchPage(page);
  await bench.open(CHANNEL);
  const id = await bench.addCandidate();

  // q = f0 / −3 dB width: 50 Hz at q 30 is 1.67 Hz wide; the cookbook Q 30 would give (fs/π)·atan(sin ω0/60) = 1.64 Hz.
  await bench.chooseKind("Notch / peak (bandwidth Q)");
  await expect(bench.summary(id)).toHaveText("Notch · 50 Hz, Q 30 (−3 dB width 1.667 Hz)");
  const note = bench.editor.getByTestId("bandwidth-q-note");
  await expect(note).toContainText("the notch is 1.67 Hz wide");
  await expect(note).toContainText("gives a 1.64 Hz wide notch");

  // A comb needs fs / f0 whole: 60 Hz at 1 kHz is refused with the nearest fundamentals that work.
  await bench.chooseKind("Comb (every harmonic)");
  await expect(bench.summary(id)).toHaveText("Comb notch · 50 Hz and harmonics, Q 30");
  await expect(bench.editor.getByTestId("comb-note")).toContainText("removes DC");
  await bench.setNumber("Fundamental", 60);
  await expect(bench.editor.getByRole("alert")).toContainText("are 58.8235 Hz and 62.5 Hz");

  await bench.chooseKind("FIR (equiripple)");
  await expect(bench.summary(id)).toHaveText("Equiripple FIR 51 taps · 2 bands");

  // A 1023-tap FIR designs at once; its zeros are found in a worker when the pole-zero map asks for them.
  await bench.chooseKind("FIR (windowed sinc)");
  await bench.setNumber("Taps", 1023);
  await expect(bench.summary(id)).toContainText("1023 taps");
  await bench.showView("Poles");
  const zeros = page.getByTestId("pz-z").locator("circle");
  await expect.poll(async () => zeros.count(), { timeout: 30_000 }).toBeGreaterThan(500);
});
