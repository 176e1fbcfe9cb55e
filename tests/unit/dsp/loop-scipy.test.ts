import { describe, expect, it } from "vitest";
import fixture from "../../fixtures/dsp/loop-references.json";
import { cAbs, cSub } from "@/lib/dsp/complex";
import { designFilter } from "@/lib/dsp/design";
import {
  closedLoopPoles,
  closedLoopStep,
  filterPhaseCost,
  loopBlocks,
  loopPolynomials,
  parseLoopModel,
  rootLocus,
  stabilityMargins,
  type Crossing,
  type LoopModel,
} from "@/lib/dsp/loop";
import { polyEval } from "@/lib/dsp/poly";
import { designFromSos, designFromTaps } from "@/lib/dsp/transfer";
import type { Complex } from "@/lib/dsp/types";

type FixtureModel = (typeof fixture.cases)[number]["model"];
const tol = fixture.tolerance;

function toModel(m: FixtureModel): LoopModel {
  const f = m.filter as { sos?: number[][]; taps?: number[] } | null;
  const filter = f === null ? null : f.sos ? designFromSos(f.sos, m.sampleRateHz) : designFromTaps(f.taps ?? [], m.sampleRateHz);
  return { ...m, filter } as LoopModel;
}

/** Every expected root has its own actual root within tol (greedy nearest match). */
function expectSameRoots(actual: Complex[], expected: number[][], within: number): void {
  expect(actual).toHaveLength(expected.length);
  const left = [...actual];
  for (const e of expected) {
    let best = 0;
    left.forEach((a, i) => {
      if (cAbs(cSub(a, e as Complex)) < cAbs(cSub(left[best], e as Complex))) best = i;
    });
    expect(cAbs(cSub(left[best], e as Complex))).toBeLessThan(within);
    left.splice(best, 1);
  }
}

function expectCrossings(actual: Crossing[], expected: number[][]): void {
  expect(actual.map((c) => c.hz)).toHaveLength(expected.length);
  actual.forEach((c, i) => {
    expect(Math.abs(c.hz / expected[i][0] - 1)).toBeLessThan(tol.crossoverHzRelative);
    expect(Math.abs(c.margin - expected[i][1])).toBeLessThan(tol.marginDegOrDb);
  });
}

describe(`loop check against ${fixture.generator} (scipy ${fixture.scipyVersion}, numpy ${fixture.numpyVersion})`, () => {
  for (const c of fixture.cases) {
    describe(`${c.name}${c.filterCall ? ` — ${c.filterCall}` : ""}`, () => {
      const model = toModel(c.model);

      it("crossovers and margins as freqz + brentq; the worst of several is reported", () => {
        const m = stabilityMargins(model);
        expectCrossings(m.gainCrossovers, c.gainCrossovers);
        expectCrossings(m.phaseCrossovers, c.phaseCrossovers);
        const worstPm = Math.min(...c.gainCrossovers.map((g) => g[1]));
        const worstGm = c.phaseCrossovers.reduce((w, p) => (Math.abs(p[1]) < Math.abs(w) ? p[1] : w), Infinity);
        expect(m.phaseMarginDeg).toBeCloseTo(worstPm, 6);
        expect(m.gainMarginDb).toBeCloseTo(worstGm, 6);
      });

      it("the expanded loop polynomials match the generator's (cont2discrete blocks, numpy.convolve)", () => {
        const { num, den } = loopPolynomials(loopBlocks(parseLoopModel(model)));
        const scale = Math.max(...c.num.map(Math.abs), ...c.den.map(Math.abs)); // see toleranceNotes
        for (const [actual, expected] of [[num, c.num], [den, c.den]]) {
          expect(actual).toHaveLength(expected.length);
          actual.forEach((v, i) => expect(Math.abs(v - expected[i])).toBeLessThanOrEqual(tol.polynomialRelativeToMax * scale));
        }
      });

      it("closed-loop poles are roots to rounding level (|p(z)| against Horner's bound Σ|c|·|z|ⁿ)", () => {
        const { num, den } = loopPolynomials(loopBlocks(parseLoopModel(model)));
        const ch = den.map((d, i) => d + num[i]);
        for (const z of closedLoopPoles(model).poles) {
          const bound = polyEval(ch.map(Math.abs), [cAbs(z), 0])[0];
          expect(cAbs(polyEval(ch, z))).toBeLessThanOrEqual(1e-12 * bound);
        }
      });

      it("closed-loop poles match numpy.roots(den + num); root locus at each k matches numpy.roots(den + k·num)", () => {
        const poles = closedLoopPoles(model);
        expectSameRoots(poles.poles, c.closedLoopPoles, tol.poleAbs);
        expect(poles.stable).toBe(c.maxPoleRadius < 1);
        const locus = rootLocus(model, fixture.locusGains);
        c.locus.forEach((l, i) => expectSameRoots(locus[i], l.poles, tol.poleAbs));
      });

      if ("step" in c) {
        it(`closed-loop step matches scipy.signal.lfilter over ${fixture.stepSamples} samples`, () => {
          const { output } = closedLoopStep(model, fixture.stepSamples);
          const expected = c.step as number[];
          output.forEach((y, i) => expect(Math.abs(y - expected[i])).toBeLessThan(tol.stepAbs));
        });
      }
    });
  }

  it("root locus at k = 0 is the set of open-loop poles: plant e^{pT}, PID integrator and derivative poles, delay, filter", () => {
    const c = fixture.cases[1];
    const model = toModel(c.model);
    const fs = model.sampleRateHz;
    const tf = 0.01 / (2 * 10); // Tf = Kd/(Kp·N) of the demo PID
    const expected: Complex[] = [
      [1, 0], // plant integrator, ZOH: e^{0·T}
      [Math.exp(-1 / (0.02 * fs)), 0], // plant lag τ = 0.02 s, ZOH: e^{−T/τ}
      [1, 0], // PID integral, Tustin
      [(2 * tf - 1 / fs) / (2 * tf + 1 / fs), 0], // PID derivative filter, Tustin: (2Tf − T)/(2Tf + T) (closed form; common practice)
      [0, 0], // one sample of computation delay
      ...model.filter!.poles,
    ];
    // The double pole at z = 1 is resolved to about √eps of the expanded polynomial (see toleranceNotes.poleAbs).
    expectSameRoots(rootLocus(model, [0])[0], expected, tol.poleAbs);
  });

  for (const p of fixture.phaseCost) {
    it(`filter phase cost: ${p.call} = ${p.lagDeg.toFixed(4)}°`, () => {
      const design = designFilter({ kind: "iir", family: "butterworth", response: "lowpass", order: p.order, cutoffHz: p.cutoffHz, sampleRateHz: p.sampleRateHz });
      expect(Math.abs(filterPhaseCost(design, p.atHz).lagDeg - p.lagDeg)).toBeLessThan(1e-6);
    });
  }
});
