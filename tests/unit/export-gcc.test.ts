import { afterAll, describe, expect, it } from "vitest";
import { quantizedParts, simulateFixed, type FilterSpec, type QuantizedPart } from "@/lib/dsp";
import { prepareExport, renderCHeader, type ExportTarget, type PreparedExport } from "@/lib/export";
import { butter4, chainWithFir, peak, sourceFor } from "./export-support";
import { compileAndRun, inputWords, scratch } from "./gcc-support";

/**
 * The strongest check of the C header: compile it with gcc next to a tiny driver that runs the
 * header's own reference step over a fixed input, and compare with lib/dsp — simulateFixed
 * bit for bit (Q15, Q31), a float32 model to float tolerance (f32); chains with an FIR stage too.
 */
const { dir, remove } = scratch();
afterAll(remove);

/** Runs the header of a prepared export through gcc (see compileAndRun). */
function compileAndRunExport(p: PreparedExport, inputs: string[], cType: string, printf: string, cast: string): string[] {
  return compileAndRun(dir, p.name, renderCHeader(p), inputs, cType, printf, cast);
}

async function prepared(spec: FilterSpec, target: ExportTarget): Promise<PreparedExport> {
  return prepareExport(sourceFor(spec, target, spec.kind === "chain" ? "Chain" : undefined), target);
}

describe("generated C header compiled with gcc", () => {
  const designs = [
    ["4th-order Butterworth low-pass", butter4],
    ["+12 dB resonant peak (saturates)", peak],
    ["chain: notch, 63-tap FIR, notch, Butterworth low-pass", chainWithFir],
  ] as const;
  for (const [label, spec] of designs) {
    for (const target of ["q15", "q31"] as const) {
      it(`${label}, ${target}: the header's step equals simulateFixed word for word`, async () => {
        const p = await prepared(spec, target);
        const bits = target === "q15" ? 15 : 31;
        const words = inputWords(bits);
        const expected = simulateFixed(p.quantized, Float64Array.from(words, (w) => w / 2 ** bits));
        const got = compileAndRunExport(p, words.map(String), target === "q15" ? "int16_t" : "int32_t", "%lld", "long long").map(Number);
        expect(got).toHaveLength(words.length);
        expect(got).toEqual(Array.from(expected.y, (y) => y * 2 ** bits));
        if (spec === peak && target === "q15") expect(expected.overflows).toBeGreaterThan(0);
      });
    }
  }

  for (const [label, spec] of [designs[0], designs[2]]) {
    it(`${label}, f32: the header's step equals a float32 model, sections in DF2T and FIR stages in direct form (relative 1e-6)`, async () => {
      const p = await prepared(spec, "f32");
      const x = inputWords(15).map((w) => Math.fround(w / 2 ** 15));
      const got = compileAndRunExport(p, x.map((v) => `${v.toPrecision(9)}f`), "float", "%.9g", "double").map(Number);
      const expected = float32Chain(quantizedParts(p.quantized), x);
      expect(got).toHaveLength(x.length);
      got.forEach((g, i) => expect(Math.abs(g - expected[i])).toBeLessThanOrEqual(1e-6 * Math.max(1, Math.abs(expected[i]))));
    });
  }
});

/**
 * The stages in order with every operation rounded to float32 (Math.fround): sections (rows
 * [b0, b1, b2, 1, a1, a2]) in direct form II transposed, FIR stages as y = h0·x, then y += h_i·x_i.
 */
function float32Chain(parts: QuantizedPart[], x: number[]): number[] {
  const f = Math.fround;
  const runners = parts.map((part) => {
    if (part.taps) {
      const taps = part.taps;
      const hist: number[] = new Array<number>(taps.length).fill(0);
      return (v: number) => {
        hist.pop();
        hist.unshift(v);
        let y = f(taps[0] * v);
        for (let i = 1; i < taps.length; i++) y = f(y + f(taps[i] * hist[i]));
        return y;
      };
    }
    const sos = part.sos ?? [];
    const d = sos.map(() => [0, 0]);
    return (input: number) => {
      let v = input;
      sos.forEach(([b0, b1, b2, , a1, a2], k) => {
        const y = f(f(b0 * v) + d[k][0]);
        d[k][0] = f(f(f(b1 * v) - f(a1 * y)) + d[k][1]);
        d[k][1] = f(f(b2 * v) - f(a2 * y));
        v = y;
      });
      return v;
    };
  });
  return x.map((input) => runners.reduce((v, run) => run(v), input));
}
