import { describe, expect, it } from "vitest";
import { designFilter } from "@/lib/dsp/design";
import { closedLoopPoles, closedLoopStep, filterPhaseCost, loopModelSchema, loopResponse, rootLocus, stabilityMargins, type LoopModel } from "@/lib/dsp/loop";

const base: LoopModel = {
  sampleRateHz: 2000,
  plant: { num: [40], den: [0.02, 1, 0] },
  controller: { kind: "pid", kp: 2, ki: 5, kd: 0.01, n: 10, method: "tustin" },
  delaySamples: 1,
  filter: null,
};

describe("loop model validation: bad parameters throw with the allowed range", () => {
  const cases: Array<[string, unknown, RegExp]> = [
    ["sample rate", { ...base, sampleRateHz: 0 }, /sampleRateHz must be above 0 and at most 1000000 Hz/],
    ["negative gain", { ...base, controller: { ...base.controller, kp: -1 } }, /kp must be from 0 to 1000000000/],
    ["derivative filter N", { ...base, controller: { ...base.controller, n: 0.5 } }, /n \(derivative filter\) must be from 1 to 1000/],
    ["kd without kp", { ...base, controller: { ...base.controller, kp: 0 } }, /kp must be above 0 when kd > 0/],
    ["all gains zero", { ...base, controller: { ...base.controller, kp: 0, ki: 0, kd: 0 } }, /at least one of kp, ki and kd/],
    ["improper plant", { ...base, plant: { num: [1, 0, 0], den: [1, 1] } }, /plant must be proper/],
    ["no delay around a biproper plant", { ...base, plant: { num: [1, 0], den: [1, 1] }, delaySamples: 0 }, /at least one sample of delay/],
    ["fractional delay", { ...base, delaySamples: 1.5 }, /delaySamples must be an integer/],
    ["delay too long", { ...base, delaySamples: 1001 }, /delaySamples must be from 0 to 1000/],
    ["prewarp missing", { ...base, controller: { ...base.controller, method: "tustin-prewarp" } }, /prewarpHz must satisfy 0 < f < sampleRateHz\/2 = 1000 Hz/],
    ["prewarp with tustin", { ...base, controller: { ...base.controller, prewarpHz: 10 } }, /only used by the 'tustin-prewarp' method/],
    ["unknown method", { ...base, controller: { ...base.controller, method: "euler" } }, /method must be one of forward-euler, backward-euler/],
    ["controller kind", { ...base, controller: { kind: "lqr" } }, /controller.kind must be 'pid' or 'tf'/],
    ["improper controller", { ...base, controller: { kind: "tf", num: [1, 0], den: [1], method: "tustin" } }, /controller must be proper/],
    [
      "filter at another rate",
      { ...base, filter: designFilter({ kind: "iir", family: "butterworth", response: "lowpass", order: 2, cutoffHz: 50, sampleRateHz: 1000 }) },
      /designed for 1000 Hz but the loop runs at 2000 Hz/,
    ],
    ["broken filter", { ...base, filter: { sampleRateHz: 2000, sos: [[1, 0, 0, 2, 0, 0]], zeros: [], poles: [], gain: 1 } }, /filter must be null or a FilterDesign/],
  ];
  for (const [what, model, message] of cases) {
    it(`${what}: ${message.source}`, () => {
      expect(loopModelSchema.safeParse(model).success).toBe(false);
      expect(() => stabilityMargins(model)).toThrow(message);
      expect(() => loopResponse(model, [1])).toThrow(message);
      expect(() => closedLoopPoles(model)).toThrow(message);
    });
  }

  it("step length, locus gains and the phase-cost frequency are range-checked", () => {
    expect(() => closedLoopStep(base, 0)).toThrow(/n must be an integer from 1 to 200000 samples/);
    expect(() => rootLocus(base, [1, -1])).toThrow(/gains must be finite numbers ≥ 0/);
    const f = designFilter({ kind: "iir", family: "butterworth", response: "lowpass", order: 2, cutoffHz: 50, sampleRateHz: 2000 });
    expect(() => filterPhaseCost(f, 1000)).toThrow(/atHz must satisfy 0 < f < fs\/2 = 1000 Hz/);
  });

  it("the demo model parses, and a filter designed at the loop rate is accepted", () => {
    const filter = designFilter({ kind: "iir", family: "butterworth", response: "lowpass", order: 2, cutoffHz: 50, sampleRateHz: 2000 });
    expect(loopModelSchema.safeParse({ ...base, filter }).success).toBe(true);
  });

  it("takes a chain's design as the filter, and its phase costs the loop what its stages' phases add up to", () => {
    const stage = { kind: "iir" as const, family: "butterworth" as const, response: "lowpass" as const, order: 2, cutoffHz: 200, sampleRateHz: 2000 };
    const notch = { kind: "biquad" as const, shape: "notch" as const, centerHz: 225, q: 5, sampleRateHz: 2000 };
    const chain = designFilter({ kind: "chain", sampleRateHz: 2000, stages: [notch, stage] });
    expect(loopModelSchema.safeParse({ ...base, filter: chain }).success).toBe(true);
    const withChain = stabilityMargins({ ...base, filter: chain });
    const without = stabilityMargins(base);
    expect(withChain.phaseMarginDeg).toBeLessThan(without.phaseMarginDeg!);
    // A cascade's phase is the sum of its stages' phases (Oppenheim & Schafer DTSP §6.3, H = Π H_stage).
    const at = 20;
    expect(filterPhaseCost(chain, at).lagDeg).toBeCloseTo(filterPhaseCost(designFilter(notch), at).lagDeg + filterPhaseCost(designFilter(stage), at).lagDeg, 9);
    const bad = { ...chain, stages: chain.stages?.map((s, i) => (i === 1 ? { ...s, sos: [[1, 0, 0, 2, 0, 0]] } : s)) };
    expect(loopModelSchema.safeParse({ ...base, filter: bad }).success).toBe(false);
  });

  it("a loop without a crossover reports null margins", () => {
    const tiny = { ...base, plant: { num: [1e-9], den: [1, 100] }, controller: { kind: "pid" as const, kp: 1, ki: 0, kd: 0, n: 10, method: "tustin" as const } };
    const m = stabilityMargins(tiny);
    expect(m.phaseMarginDeg).toBeNull();
    expect(m.gainCrossoverHz).toBeNull();
    expect(m.delayMarginMs).toBeNull();
  });
});
