import { describe, expect, it } from "vitest";
import { freqGrid, frequencyResponse, responseGrid } from "@/lib/dsp/analysis";
import { designFilter } from "@/lib/dsp/design";
import type { FilterDesign } from "@/lib/dsp/types";

const FS = 1000;
const notch = designFilter({ kind: "notch", shape: "notch", centerHz: 49.98, q: 30, sampleRateHz: FS });
const minDb = (design: FilterDesign, freqs: number[]) => Math.min(...frequencyResponse(design, freqs).magnitudeDb);

/**
 * |H(e^{jθ})| of one biquad (b0 + b1 z⁻¹ + b2 z⁻²)/(1 + a1 z⁻¹ + a2 z⁻²) evaluated term by term, independent of
 * lib/dsp's evaluation (Oppenheim & Schafer, Discrete-Time Signal Processing, 3rd ed., §5.3, eq. for H(e^{jω})).
 */
function biquadDb([b0, b1, b2, , a1, a2]: number[], theta: number): number {
  const num = [b0 + b1 * Math.cos(theta) + b2 * Math.cos(2 * theta), -(b1 * Math.sin(theta) + b2 * Math.sin(2 * theta))];
  const den = [1 + a1 * Math.cos(theta) + a2 * Math.cos(2 * theta), -(a1 * Math.sin(theta) + a2 * Math.sin(2 * theta))];
  return 20 * Math.log10(Math.hypot(num[0], num[1]) / Math.hypot(den[0], den[1]));
}

describe("responseGrid", () => {
  it("reaches the depth of a 49.98 Hz, Q 30 notch that the plain log grid steps over", () => {
    // The zero lies on the unit circle, so the exact |H| at its angle is 0 (−∞ dB); the plot must reach −80 dB.
    const plain = minDb(notch, freqGrid(FS, 600, "log"));
    expect(plain).toBeGreaterThan(-40);
    expect(minDb(notch, responseGrid(notch, 600))).toBeLessThanOrEqual(-80);
  });

  it("plots a zero just inside the unit circle within 1 dB of the exact |H| at its angle", () => {
    // Zeros at radius 0.999999 and poles at 0.995, both at 49.98 Hz: a notch about −74 dB deep, not infinitely deep.
    const theta = (2 * Math.PI * 49.98) / FS;
    const [r, p] = [0.999999, 0.995];
    const row = [1, -2 * r * Math.cos(theta), r * r, 1, -2 * p * Math.cos(theta), p * p];
    const design: FilterDesign = {
      sampleRateHz: FS,
      sos: [row],
      zeros: [[r * Math.cos(theta), r * Math.sin(theta)], [r * Math.cos(theta), -r * Math.sin(theta)]],
      poles: [[p * Math.cos(theta), p * Math.sin(theta)], [p * Math.cos(theta), -p * Math.sin(theta)]],
      gain: 1,
    };
    const exact = biquadDb(row, theta);
    expect(exact).toBeLessThan(-60);
    expect(exact).toBeGreaterThan(-80);
    const plotted = minDb(design, responseGrid(design, 600));
    expect(Math.abs(plotted - exact)).toBeLessThanOrEqual(1);
  });

  it("gives a zoomed range its own grid, with the notch's angle in it", () => {
    const grid = responseGrid(notch, 200, [45, 55]);
    expect(grid[0]).toBe(45);
    expect(grid[grid.length - 1]).toBe(55);
    expect(grid.every((f, i) => i === 0 || f > grid[i - 1])).toBe(true);
    expect(grid.length).toBeGreaterThan(200);
    expect(minDb(notch, grid)).toBeLessThanOrEqual(-80);
  });

  it("adds nothing for roots far from the unit circle or outside the range", () => {
    const far: FilterDesign = { sampleRateHz: FS, sos: [[1, 0, 0.25, 1, 0, 0.25]], zeros: [[0, 0.5], [0, -0.5]], poles: [[0, 0.5], [0, -0.5]], gain: 1 };
    expect(responseGrid(far, 100)).toHaveLength(100);
    expect(responseGrid(notch, 100, [100, 400])).toHaveLength(100);
  });

  it("refuses a range beyond half the sample rate, with the allowed range in words", () => {
    expect(() => responseGrid(notch, 100, [10, 600])).toThrow(/0 < low < high ≤ 500 Hz/);
    expect(() => responseGrid(notch, 1)).toThrow(/integer ≥ 2/);
  });
});
