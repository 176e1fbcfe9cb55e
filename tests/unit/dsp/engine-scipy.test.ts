import { describe, expect, it } from "vitest";
import fixture from "../../fixtures/dsp/engine-scipy.json";
import { filterSignal } from "@/lib/dsp/engine/filter-signal";
import { createStreamingFilter } from "@/lib/dsp/engine/streaming-filter";
import type { FilterDesign } from "@/lib/dsp/types";

interface Case {
  name: string;
  kind: "sos" | "fir";
  initial: "zero" | "step";
  sos?: number[][];
  taps?: number[];
  signal: keyof typeof fixture.signals;
  y: number[];
}

const cases = fixture.cases as Case[];

function designOf(c: Case): FilterDesign {
  const base = { sampleRateHz: 1000, zeros: [], poles: [], gain: 1 };
  return c.kind === "sos" ? { ...base, sos: c.sos } : { ...base, taps: c.taps };
}

function maxAbsDiff(a: Float64Array, b: number[]): number {
  return b.reduce((m, v, i) => Math.max(m, Math.abs(a[i] - v)), 0);
}

// Tolerance and its justification are recorded in the fixture by tests/fixtures/gen/engine.py (scipy 1.10.1).
describe(`filterSignal against scipy.signal ${fixture.scipyVersion}`, () => {
  it.each(cases.map((c) => [c.name, c] as const))("%s", (_name, c) => {
    const x = Float64Array.from(fixture.signals[c.signal].x);
    const y = filterSignal(designOf(c), x, { initial: c.initial });
    const scale = Math.max(1, ...c.y.map(Math.abs));
    expect(maxAbsDiff(y, c.y)).toBeLessThanOrEqual(fixture.tolerance.absolute * scale);
  });

  it("is bit-identical to sosfilt from rest (same DF2T operation order)", () => {
    const fromRest = cases.filter((c) => c.kind === "sos" && c.initial === "zero" && !c.name.startsWith("butter4_ba"));
    expect(fromRest.length).toBeGreaterThan(10);
    for (const c of fromRest) {
      const y = filterSignal(designOf(c), Float64Array.from(fixture.signals[c.signal].x));
      expect(Array.from(y), c.name).toEqual(c.y);
    }
  });

  it("matches scipy when the same signal is streamed in uneven blocks", () => {
    for (const c of cases) {
      const x = Float64Array.from(fixture.signals[c.signal].x);
      const f = createStreamingFilter(designOf(c), { initial: c.initial });
      const parts = [1, 7, 0, 64, 3, 128, 197].map((len, i, all) => {
        const start = all.slice(0, i).reduce((s, v) => s + v, 0);
        return f.process(x.subarray(start, start + len));
      });
      const joined = new Float64Array(x.length);
      parts.reduce((at, p) => (joined.set(p, at), at + p.length), 0);
      expect(joined, c.name).toEqual(filterSignal(designOf(c), x, { initial: c.initial }));
    }
  });
});
