import { describe, expect, it } from "vitest";
import fixture from "../../fixtures/dsp/designs-pasted-ba.json";
import { dcGain, stepMetrics } from "@/lib/dsp/analysis";
import { designFilter } from "@/lib/dsp/design";
import { filterSignal } from "@/lib/dsp/engine";
import type { CoefficientsSpec } from "@/lib/dsp/spec";

const tol = fixture.tolerance;
const maxAbs = (v: ArrayLike<number>) => Array.from(v).reduce((m, x) => Math.max(m, Math.abs(x)), 0);

/** Largest |ours − theirs| relative to max |theirs| (the fixture's outputRelativeToMax measure). */
function relativeToMax(ours: Float64Array, theirs: number[]): number {
  return Array.from(ours).reduce((m, v, i) => Math.max(m, Math.abs(v - theirs[i])), 0) / maxAbs(theirs);
}

describe(`pasted b/a keep their exact transfer function (${fixture.calls}; scipy ${fixture.scipyVersion})`, () => {
  it.each(fixture.cases.map((c) => [c.label, c] as const))("%s", (_label, c) => {
    const design = designFilter(c.spec as CoefficientsSpec);
    const x = Float64Array.from(c.x);
    expect(relativeToMax(filterSignal(design, x), c.y)).toBeLessThanOrEqual(tol.outputRelativeToMax);
    expect(relativeToMax(filterSignal(design, x, { initial: "step" }), c.yStep)).toBeLessThanOrEqual(tol.outputRelativeToMax);
    const exact = c.dcGainExact;
    expect(Math.abs(dcGain(design) - exact)).toBeLessThanOrEqual(tol.dcGainRelative * Math.abs(exact));
    const finalValue = stepMetrics(design).finalValue;
    expect(finalValue).not.toBeNull();
    expect(Math.abs((finalValue ?? NaN) - exact)).toBeLessThanOrEqual(tol.dcGainRelative * Math.abs(exact));
  });

  it("runs in lfilter's arithmetic order: every output sample is bit-identical to scipy's", () => {
    for (const c of fixture.cases) {
      const y = filterSignal(designFilter(c.spec as CoefficientsSpec), Float64Array.from(c.x));
      expect(Array.from(y)).toEqual(c.y);
    }
  });
});
