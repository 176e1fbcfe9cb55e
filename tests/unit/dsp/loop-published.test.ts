import { describe, expect, it } from "vitest";
import { designFilter } from "@/lib/dsp/design";
import { closedLoopPoles, closedLoopStep, controllerTf, filterPhaseCost, rootLocus, stabilityMargins, type LoopModel } from "@/lib/dsp/loop";

const DEG = 180 / Math.PI;
const p1 = { kind: "pid" as const, kp: 1, ki: 0, kd: 0, n: 10, method: "tustin" as const };

/** Unity feedback around L(s) = ωn²/(s(s + 2ζωn)), the plant ZOH-discretised at fs ≫ ωn, C = 1. */
function secondOrderLoop(zeta: number, wn: number, fs: number): LoopModel {
  return { sampleRateHz: fs, plant: { num: [wn * wn], den: [1, 2 * zeta * wn, 0] }, controller: p1, delaySamples: 0, filter: null };
}

describe("phase margin of the unity-feedback second-order loop (Nise, Control Systems Engineering, 6th ed., ch. 10 — section from memory)", () => {
  const wn = 2 * Math.PI; // 1 Hz
  const fs = 10_000;
  for (const [zeta, published] of [[0.5, 51.8], [0.707, 65.5]] as const) {
    it(`ζ = ${zeta}: PM ≈ ${published}° (Nise), crossover ωc = ωn·√(√(1+4ζ⁴) − 2ζ²)`, () => {
      const m = stabilityMargins(secondOrderLoop(zeta, wn, fs));
      const root = Math.sqrt(Math.sqrt(1 + 4 * zeta ** 4) - 2 * zeta ** 2);
      const wc = wn * root;
      const formula = Math.atan((2 * zeta) / root) * DEG; // Nise: PM = atan(2ζ/√(√(1+4ζ⁴) − 2ζ²))
      // The ZOH adds about ωc·T/2 of lag (Franklin, Powell & Workman, Digital Control of Dynamic Systems, 3rd ed., §6.3.2); at fs = 10 kHz that is 0.014°.
      const zohLagDeg = ((wc / fs) / 2) * DEG;
      expect(Math.abs(m.phaseMarginDeg! - (formula - zohLagDeg))).toBeLessThan(0.1 * zohLagDeg);
      expect(Math.abs(m.phaseMarginDeg! - published)).toBeLessThan(0.05 + 1.1 * zohLagDeg); // published to 0.1°
      expect(m.gainCrossoverHz! / (wc / (2 * Math.PI))).toBeCloseTo(1, 6);
    });
  }
});

/**
 * L(z) = K·z⁻¹/(1 − z⁻¹): the ZOH image of a/s with K = a/fs (Franklin, Powell & Workman, Digital Control of Dynamic Systems, 3rd ed., §6.3.2), C = 1.
 * Derived here: |L(e^{jω})| = K/(2·sin(ω/2)), arg L = −π/2 − ω/2; L(−1) = −K/2, so the phase crossover is at
 * Nyquist with GM = 20·log10(2/K); the gain crossover is at ω = 2·asin(K/2) with PM = 90° − ω/2; the closed
 * loop 1 + L = 0 has its pole at z = 1 − K and the step response y[n] = 1 − (1 − K)ⁿ.
 */
describe("the discrete integrator loop K·z⁻¹/(1 − z⁻¹) (closed forms derived above)", () => {
  const fs = 1000;
  const K = 0.5;
  const model: LoopModel = { sampleRateHz: fs, plant: { num: [K * fs], den: [1, 0] }, controller: p1, delaySamples: 0, filter: null };

  it("gain margin 20·log10(2/K) at Nyquist, phase margin 90° − asin(K/2)", () => {
    const m = stabilityMargins(model);
    expect(m.gainMarginDb).toBeCloseTo(20 * Math.log10(2 / K), 9);
    expect(m.phaseCrossoverHz).toBe(fs / 2);
    const w = 2 * Math.asin(K / 2);
    expect(m.gainCrossoverHz).toBeCloseTo((w * fs) / (2 * Math.PI), 7);
    expect(m.phaseMarginDeg).toBeCloseTo(90 - (w / 2) * DEG, 7);
    expect(m.delayMarginMs).toBeCloseTo(((90 - (w / 2) * DEG) / (360 * ((w * fs) / (2 * Math.PI)))) * 1000, 7);
  });

  it("closed-loop pole at 1 − K; root locus poles 1 − k·K; k = 0 gives the open-loop pole z = 1", () => {
    expect(closedLoopPoles(model).poles[0][0]).toBeCloseTo(1 - K, 14);
    const locus = rootLocus(model, [0, 1, 3]);
    expect(locus.map((p) => p[0][0])).toEqual([1, 1 - K, 1 - 3 * K].map((v) => expect.closeTo(v, 14)));
    expect(closedLoopPoles({ ...model, plant: { num: [2.5 * fs], den: [1, 0] } }).stable).toBe(false);
  });

  it("step: y[n] = 1 − (1 − K)ⁿ, settling to 1 (type-1 loop)", () => {
    const { output, timeS } = closedLoopStep(model, 60);
    output.forEach((y, n) => expect(y).toBeCloseTo(1 - (1 - K) ** n, 14));
    expect(timeS[10]).toBeCloseTo(0.01, 15);
    expect(output[59]).toBeCloseTo(1, 14);
  });

  it("a computation delay of d samples takes 360°·fc·d/fs off the phase margin and leaves the crossover", () => {
    const m0 = stabilityMargins(model);
    const m3 = stabilityMargins({ ...model, delaySamples: 3 });
    expect(m3.gainCrossoverHz).toBeCloseTo(m0.gainCrossoverHz!, 7);
    expect(m0.phaseMarginDeg! - m3.phaseMarginDeg!).toBeCloseTo((360 * m0.gainCrossoverHz! * 3) / fs, 7);
  });
});

describe("phase cost of sensor filters at the crossover (closed forms of the analog prototypes: atan(x) for order 1, atan(√2·x/(1 − x²)) for order 2, x = crossover/corner)", () => {
  const fs = 100_000; // fs ≫ fc so the digital filter matches its analog prototype to < 0.01°
  const fc = 10;
  const closedForm: Record<number, [number, number, number]> = { 1: [5.7, 11.3, 18.4], 2: [8.1, 16.4, 27.9] };
  for (const order of [1, 2] as const) {
    [10, 5, 3].forEach((ratio, i) => {
      it(`Butterworth order ${order}, corner ${ratio}× the crossover: ${closedForm[order][i]}°`, () => {
        const design = designFilter({ kind: "iir", family: "butterworth", response: "lowpass", order, cutoffHz: ratio * fc, sampleRateHz: fs });
        const cost = filterPhaseCost(design, fc);
        expect(Math.abs(cost.lagDeg - closedForm[order][i])).toBeLessThan(0.05); // rounded to 0.1°
        expect(cost.lagMs).toBeCloseTo((cost.lagDeg / (360 * fc)) * 1000, 12);
      });
    });
  }

  it("a pure delay Td costs 360°·f·Td: 2 ms at 50 Hz = 36° (the phase of e^{−jωTd}; common practice)", () => {
    const delay = designFilter({ kind: "coefficients", b: [0, 0, 1], sampleRateHz: 1000 });
    const cost = filterPhaseCost(delay, 50);
    expect(cost.lagDeg).toBeCloseTo(36, 10);
    expect(cost.lagMs).toBeCloseTo(2, 10);
  });
});

describe("PID derivative-filter pole per discretisation (Tf = 0.4 ms, h = 1 ms; closed forms: backward Tf/(Tf+h), Tustin (2Tf−h)/(2Tf+h), ZOH e^{−h/Tf}, forward 1 − h/Tf)", () => {
  // Kd = 0.004, Kp = 1, N = 10 gives Tf = Kd/(Kp·N) = 0.4 ms; with Ki = 0 the controller has only that pole.
  const expected = { "backward-euler": 0.2857, tustin: -0.1111, zoh: 0.0821, "forward-euler": -1.5 } as const;
  for (const [method, pole] of Object.entries(expected)) {
    it(`${method}: pole ${pole}`, () => {
      const { a } = controllerTf({ kind: "pid", kp: 1, ki: 0, kd: 0.004, n: 10, method: method as keyof typeof expected }, 1000);
      expect(a).toHaveLength(2);
      expect(-a[1]).toBeCloseTo(pole, 4); // rounded to 4 decimals
    });
  }
});
