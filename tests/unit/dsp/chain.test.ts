import fc from "fast-check";
import { describe, expect, it } from "vitest";
import {
  createStreamingFilter,
  dcGain,
  designFilter,
  designZeros,
  filterSignal,
  filterSpecSchema,
  frequencyResponse,
  quantizeDesign,
  simulateFixed,
  stability,
  stepResponse,
  type ChainSpec,
  type ChainStage,
  type StageSpec,
} from "@/lib/dsp";

const fs = 1000;
const notch = (centerHz: number): StageSpec => ({ kind: "biquad", shape: "notch", centerHz, q: 30, sampleRateHz: fs });
const lowpass: StageSpec = { kind: "iir", family: "butterworth", response: "lowpass", order: 4, cutoffHz: 120, sampleRateHz: fs };
const fir: StageSpec = { kind: "fir", response: "lowpass", window: "hann", taps: 41, cutoffHz: 250, sampleRateHz: fs };
const chainOf = (...stages: ChainStage[]): ChainSpec => ({ kind: "chain", sampleRateHz: fs, stages });
const humChain = chainOf(notch(50), notch(150), lowpass);

function refusal(spec: unknown): string {
  const r = filterSpecSchema.safeParse(spec);
  expect(r.success).toBe(false);
  return (r.error?.issues ?? []).map((i) => `${i.path.join(".")}: ${i.message}`).join("\n");
}

describe("chain spec", () => {
  it("refuses 9 stages, a nested chain, a stage at another rate and an empty chain, naming the stage", () => {
    expect(refusal(chainOf(...Array.from({ length: 9 }, () => notch(50))))).toMatch(/^stages: a chain holds at most 8 stages \(got 9\)/);
    expect(refusal({ ...humChain, stages: [notch(50), humChain] })).toMatch(/^stages\.1\.kind: a chain cannot hold another chain/);
    expect(refusal(chainOf(notch(50), { ...notch(150), sampleRateHz: 2000 }))).toMatch(
      /^stages\.1\.sampleRateHz: stage 2 is designed for 2000 Hz but the chain runs at 1000 Hz/,
    );
    expect(refusal(chainOf())).toMatch(/^stages: a chain needs at least 1 stage \(got 0\)/);
    expect(refusal(chainOf({ ...notch(50), bypassed: true }))).toMatch(/every stage is bypassed/);
    expect(refusal(chainOf(notch(50), notch(600)))).toMatch(/^stages\.1\.centerHz: .*500 Hz\) \(got 600 Hz\)/);
  });

  it("designFilter throws naming the stage in words", () => {
    expect(() => designFilter(chainOf(notch(50), notch(600)))).toThrow(/\nstage 2: The centre frequency must be above 0 Hz/);
  });

  it("a single spec keeps designing as it did (no stages)", () => {
    const d = designFilter(notch(50));
    expect(d.stages).toBeUndefined();
    expect(d.sos).toHaveLength(1);
  });
});

describe("chain = its stages in sequence", () => {
  const stageDesigns = [notch(50), notch(150), lowpass, fir].map((s) => designFilter(s));
  const chain = designFilter(chainOf(notch(50), notch(150), lowpass, fir));
  const freqs = Array.from({ length: 501 }, (_, i) => i);

  // 1e-12 relative to |Π H_k|, plus a rounding floor of 1e-15 × the passband level for frequencies
  // where a stage has an exact zero (the notch centres lie on this 1 Hz grid) and both are ~1e-17.
  it("response = product of the stages' responses (1e-12 relative), phase and delay add", () => {
    const whole = frequencyResponse(chain, freqs);
    const parts = stageDesigns.map((d) => frequencyResponse(d, freqs));
    const linear = (db: number) => 10 ** (db / 20);
    freqs.forEach((_, i) => {
      const product = parts.reduce((p, r) => p * linear(r.magnitudeDb[i]), 1);
      expect(Math.abs(linear(whole.magnitudeDb[i]) - product)).toBeLessThanOrEqual(1e-12 * product + 1e-15);
      const delay = parts.reduce((s, r) => s + r.groupDelaySamples[i], 0);
      expect(whole.groupDelaySamples[i]).toBeCloseTo(delay, 9);
    });
    expect(designZeros(chain)).toHaveLength(stageDesigns.reduce((n, d) => n + designZeros(d).length, 0));
    expect(chain.gain).toBeCloseTo(stageDesigns.reduce((g, d) => g * d.gain, 1), 12);
  });

  it("filtering = running the stages one after the other (1e-12 relative to max |y|), for any block split", () => {
    fc.assert(
      fc.property(fc.array(fc.double({ min: -1, max: 1, noNaN: true }), { minLength: 1, maxLength: 300 }), fc.integer({ min: 1, max: 64 }), (xs, block) => {
        const x = Float64Array.from(xs);
        const sequence = stageDesigns.reduce<Float64Array>((v, d) => filterSignal(d, v), x);
        const scale = Math.max(1e-300, ...Array.from(sequence, Math.abs));
        const once = filterSignal(chain, x);
        const streaming = createStreamingFilter(chain);
        const chunks = new Float64Array(x.length);
        for (let i = 0; i < x.length; i += block) chunks.set(streaming.process(x.subarray(i, i + block)), i);
        x.forEach((_, i) => {
          expect(Math.abs(once[i] - sequence[i])).toBeLessThanOrEqual(1e-12 * scale);
          expect(chunks[i]).toBe(once[i]);
        });
      }),
      { numRuns: 60 },
    );
  });

  it("starts at steady state for 'step' across stages, and DC gain is the product", () => {
    const y = filterSignal(chain, new Float64Array(50).fill(3), { initial: "step" });
    const g = dcGain(chain);
    expect(g).toBeCloseTo(stageDesigns.reduce((p, d) => p * dcGain(d), 1), 12);
    y.forEach((v) => expect(v).toBeCloseTo(3 * g, 9));
    expect(stepResponse(chain, 6000)[5999]).toBeCloseTo(g, 9);
  });

  it("is stable iff every stage is", () => {
    expect(stability(chain).stable).toBe(true);
    const integrator: StageSpec = { kind: "coefficients", b: [1], a: [1, -1], sampleRateHz: fs };
    expect(stability(designFilter(chainOf(notch(50), integrator))).stable).toBe(false);
  });
});

describe("chain quantization", () => {
  const chain = designFilter(humChain);

  it("keeps the stages, spreads the gain so no stage output peaks above full scale for a sinusoid", () => {
    const q = quantizeDesign(chain, "q15");
    expect(q.stages?.map((s) => s.stage)).toEqual([0, 1, 2]);
    expect(q.stages?.map((s) => s.integers?.length)).toEqual([1, 1, 2]);
    expect(q.stable).toBe(true);
    expect(q.headroom).toHaveLength(3);
    for (const h of q.headroom ?? []) expect(h.sinePeakDb).toBeLessThanOrEqual(0.01);
    expect(quantizeDesign(chain, "q31").maxDeviationDb).toBeLessThan(1e-3);
  });

  it("the fixed-point simulation follows the float chain on a full-scale hum without overflow", () => {
    const q = quantizeDesign(chain, "q31");
    const n = 2000;
    const x = Float64Array.from({ length: n }, (_, k) => 0.45 * Math.sin((2 * Math.PI * 50 * k) / fs) + 0.45 * Math.sin((2 * Math.PI * 7 * k) / fs));
    const sim = simulateFixed(q, x);
    const ref = filterSignal(chain, x);
    expect(sim.overflows).toBe(0);
    const err = Math.max(...Array.from(sim.y, (v, i) => Math.abs(v - ref[i])));
    expect(err).toBeLessThan(1e-4);
  });
});
