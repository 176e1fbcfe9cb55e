import { describe, expect, it } from "vitest";
import fixture from "../../fixtures/dsp/chain-scipy.json";
import { designFilter, filterSignal, frequencyResponse, type ChainSpec, type StageSpec } from "@/lib/dsp";

const fs = fixture.sampleRateHz;
const stages: StageSpec[] = [
  { kind: "coefficients", sos: fixture.notch50, sampleRateHz: fs },
  { kind: "coefficients", sos: fixture.notch150, sampleRateHz: fs },
  { kind: "iir", family: "butterworth", response: "lowpass", order: 4, cutoffHz: 200, sampleRateHz: fs },
  { kind: "fir", response: "lowpass", window: "hamming", taps: 31, cutoffHz: 300, sampleRateHz: fs },
];
const chain: ChainSpec = { kind: "chain", sampleRateHz: fs, stages };

const maxAbs = (v: ArrayLike<number>) => Array.from(v).reduce((m, x) => Math.max(m, Math.abs(x)), 0);
const maxDiff = (a: ArrayLike<number>, b: ArrayLike<number>) => Array.from(a).reduce((m, x, i) => Math.max(m, Math.abs(x - b[i])), 0);

// Reference: a cascade of scipy designs (numpy.vstack of their sos, then lfilter of the firwin taps),
// scipy.signal 1.10.1 through tests/fixtures/gen/chain.py, tolerances recorded in the fixture.
describe(`a chain against the same cascade built in scipy.signal ${fixture.scipyVersion}`, () => {
  const design = designFilter(chain);

  it("has one running stage per spec stage, sections in stage order, FIR as taps", () => {
    expect(design.stages?.map((s) => s.stage)).toEqual([0, 1, 2, 3]);
    expect(design.stages?.[0].sos).toHaveLength(1);
    expect(design.stages?.[2].sos).toHaveLength(2);
    expect(design.stages?.[3].taps).toHaveLength(31);
    expect(design.sos).toBeUndefined();
  });

  it("frequency response equals sosfreqz(vstack) · freqz(taps)", () => {
    const r = frequencyResponse(design, fixture.freqsHz);
    const ref = fixture.re.map((re, i) => Math.hypot(re, fixture.im[i]));
    const mag = r.magnitudeDb.map((db) => 10 ** (db / 20));
    expect(maxDiff(mag, ref)).toBeLessThanOrEqual(fixture.tolerance.responseRelative * maxAbs(ref));
  });

  it("filtering equals sosfilt(vstack) then lfilter(taps)", () => {
    const y = filterSignal(design, Float64Array.from(fixture.x));
    expect(maxDiff(y, fixture.y)).toBeLessThanOrEqual(fixture.tolerance.filterRelative * maxAbs(fixture.y));
  });

  it("a bypassed stage is kept in the chain and not run", () => {
    const bypassed = designFilter({ ...chain, stages: stages.map((s, i) => (i === 1 ? { ...s, bypassed: true } : s)) });
    expect(bypassed.stages?.map((s) => s.stage)).toEqual([0, 2, 3]);
    const y = filterSignal(bypassed, Float64Array.from(fixture.x));
    expect(maxDiff(y, fixture.yBypassed150)).toBeLessThanOrEqual(fixture.tolerance.filterRelative * maxAbs(fixture.yBypassed150));
  });
});
