import { describe, expect, it } from "vitest";
import fixture from "../../fixtures/dsp/analysis-step.json";
import { impulseResponse, MAX_STEP_SAMPLES, stepMetrics, stepResponse } from "@/lib/dsp/analysis";
import { designIir } from "@/lib/dsp/iir/design";
import type { FilterDesign } from "@/lib/dsp/types";

interface StepCase {
  name: string;
  sampleRateHz: number;
  sos: number[][];
  n: number;
  y: number[];
  metrics: { riseTimeS: number | null; overshootPercent: number; settlingTimeS: number | null; finalValue: number };
}

const tol = fixture.tolerance;

function sosDesign(sampleRateHz: number, sos: number[][]): FilterDesign {
  return { sampleRateHz, sos, zeros: [], poles: [], gain: 1 };
}

/** Tustin (bilinear, s = 2fs·(1 − z⁻¹)/(1 + z⁻¹)) discretisation of ωn²/(s² + 2ζωn·s + ωn²), one SOS row. */
function tustinSecondOrder(zeta: number, wn: number, fs: number): number[] {
  const k = 2 * fs;
  const a0 = k * k + 2 * zeta * wn * k + wn * wn;
  const g = (wn * wn) / a0;
  return [g, 2 * g, g, 1, (2 * wn * wn - 2 * k * k) / a0, (k * k - 2 * zeta * wn * k + wn * wn) / a0];
}

// Tolerances and their reasons are recorded in the fixture by tests/fixtures/gen/analysis.py (scipy 1.10.1).
describe(`step responses and metrics against scipy.signal.sosfilt ${fixture.scipyVersion}`, () => {
  it.each((fixture.cases as StepCase[]).map((c) => [c.name, c] as const))("%s", (_name, c) => {
    const d = sosDesign(c.sampleRateHz, c.sos);
    const y = stepResponse(d, c.n);
    const scale = Math.max(1, ...c.y.map(Math.abs));
    c.y.forEach((v, i) => expect(Math.abs(y[i] - v)).toBeLessThanOrEqual(tol.response * scale));
    const m = stepMetrics(d);
    const e = c.metrics;
    expect(m.finalValue).toBeCloseTo(e.finalValue, 12);
    expect(Math.abs((m.riseTimeS ?? NaN) - (e.riseTimeS ?? NaN))).toBeLessThanOrEqual(tol.timeS);
    expect(Math.abs((m.overshootPercent ?? NaN) - e.overshootPercent)).toBeLessThanOrEqual(tol.overshootPercent);
    expect(Math.abs((m.settlingTimeS ?? NaN) - (e.settlingTimeS ?? NaN))).toBeLessThanOrEqual(tol.timeS);
  });
});

describe("stepMetrics: published checks", () => {
  const fs = 1000;
  const wn = 1;
  const zeta = 0.5;
  const m = stepMetrics(sosDesign(fs, [tustinSecondOrder(zeta, wn, fs)]));

  it("second order, ζ = 0.5: overshoot exp(−ζπ/√(1−ζ²)) = 16.30 % (Ogata, Modern Control Engineering, 5th ed., ch. 5 — from memory)", () => {
    // Tustin with ωn·T = 1e-3 (fs = 1 kHz, ωn = 1 rad/s): warping and sampling move the peak by < 1e-3 points.
    const expected = 100 * Math.exp((-zeta * Math.PI) / Math.sqrt(1 - zeta * zeta));
    expect(expected).toBeCloseTo(16.3, 2);
    expect(Math.abs((m.overshootPercent ?? NaN) - expected)).toBeLessThan(1e-3);
  });

  it("second order, ζ = 0.5: ωn·tr(10–90 %) = 1.638 (Nise, Control Systems Engineering, 6th ed., ch. 4, normalized rise time against ζ — from memory), to ±0.001", () => {
    expect(Math.abs(wn * (m.riseTimeS ?? NaN) - 1.638)).toBeLessThanOrEqual(1e-3);
  });

  it("second order, ζ = 0.5: 2 % settling ≈ 4/(ζωn) = 8 s (common practice: 4/(ζωn) for the 2 % band; loose, ±5 %)", () => {
    expect(Math.abs((m.settlingTimeS ?? NaN) - 4 / (zeta * wn)) / 8).toBeLessThan(0.05);
    // 1 + a1 + a2 ≈ 1e-6 here, so the DC gain carries ~1e-10 relative cancellation error.
    expect(m.finalValue).toBeCloseTo(1, 8);
  });

  it("first order: tr(10–90 %) = ln 9 · τ (from 1 − e^{−t/τ}: τ·ln(0.9/0.1); common practice), ZOH step-invariant so samples are exact", () => {
    const tau = 0.1;
    const p = Math.exp(-1 / (fs * tau));
    const m1 = stepMetrics(sosDesign(fs, [[0, 1 - p, 0, 1, -p, 0]]));
    // Linear interpolation between exact samples: error O((T/τ)²) = 1e-4 relative at most.
    expect(Math.abs((m1.riseTimeS ?? NaN) - Math.log(9) * tau) / (Math.log(9) * tau)).toBeLessThan(1e-4);
    expect(m1.overshootPercent).toBe(0);
    expect(Math.abs((m1.settlingTimeS ?? NaN) - Math.log(50) * tau)).toBeLessThanOrEqual(1 / fs);
  });
});

describe("stepMetrics: undefined metrics are null", () => {
  it("a highpass (final value 0) gives null rise, overshoot and settling", () => {
    const hp = sosDesign(1000, [[0.5, -1, 0.5, 1, -0.5, 0.1]]);
    expect(stepMetrics(hp)).toEqual({ riseTimeS: null, overshootPercent: null, settlingTimeS: null, finalValue: 0 });
  });

  it("an elliptic highpass settling to its −60 dB stopband level (DC blocked, > 20 dB down) gives null metrics", () => {
    const hp = designIir({
      kind: "iir", family: "elliptic", response: "highpass", order: 6, cutoffHz: 20, sampleRateHz: 48000,
      passbandRippleDb: 0.5, stopbandAttenuationDb: 60,
    });
    const m = stepMetrics(hp);
    expect(m).toMatchObject({ riseTimeS: null, overshootPercent: null, settlingTimeS: null });
    expect(m.finalValue).toBeCloseTo(1e-3, 9);
  });

  it("an unstable design gives null metrics but its DC gain as final value", () => {
    const bad = sosDesign(1000, [[1, 0, 0, 1, -0.5, -0.6]]);
    const m = stepMetrics(bad);
    expect(m).toMatchObject({ riseTimeS: null, overshootPercent: null, settlingTimeS: null });
    expect(m.finalValue).toBeCloseTo(1 / (1 - 0.5 - 0.6), 12);
  });

  it("an integrator (pole at z = 1) has no final value", () => {
    const integrator = sosDesign(1000, [[1, 0, 0, 1, -1, 0]]);
    expect(stepMetrics(integrator).finalValue).toBeNull();
  });

  it("a lightly damped pole beyond the simulation cap is reported as not settled", () => {
    const r = 1 - 1e-7;
    const slow = sosDesign(1000, [[1 - r, 0, 0, 1, -r, 0]]);
    const m = stepMetrics(slow);
    expect(m.settlingTimeS).toBeNull();
    expect(m.riseTimeS).toBeNull();
    expect(MAX_STEP_SAMPLES).toBe(1 << 20);
  });
});

describe("impulseResponse", () => {
  it("returns the taps of an FIR design followed by zeros", () => {
    const fir: FilterDesign = { sampleRateHz: 1000, taps: [0.25, 0.5, 0.25], zeros: [], poles: [], gain: 1 };
    expect(Array.from(impulseResponse(fir, 5))).toEqual([0.25, 0.5, 0.25, 0, 0]);
    expect(() => impulseResponse(fir, 0)).toThrow(/≥ 1/);
  });
});
