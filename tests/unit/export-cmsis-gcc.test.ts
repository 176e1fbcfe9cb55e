import { afterAll, describe, expect, it } from "vitest";
import { quantizedParts, simulateFixed, type FilterSpec, type QuantizedPart } from "@/lib/dsp";
import { prepareExport, renderExport, type ExportTarget, type PreparedExport } from "@/lib/export";
import { butter4, chainAsymmetric, chainWithFir, peak, sourceFor } from "./export-support";
import { compileAndRunCmsis, inputWords, scratch } from "./gcc-support";

/**
 * The CMSIS-DSP layouts, compiled: each cmsis-df1 / cmsis-df2t header goes through gcc -std=c99
 * -pedantic -Wall -Wextra -Werror (with the address and undefined-behaviour sanitizers) together with
 * a small harness of the documented kernel arithmetic (tests/unit/cmsis-harness, written from the
 * library's documentation, not its source), using the set-up and per-block lines of the header's own
 * usage comment. Q15/Q31 must equal simulateFixed in the library's arithmetic word for word, standard
 * and fast kernels; f32 must equal a float32 model of the documented order within float32 rounding.
 */

const { dir, remove } = scratch();
afterAll(remove);

const DESIGNS = [
  ["4th-order Butterworth low-pass", butter4],
  ["+12 dB resonant peak (saturates)", peak],
  ["chain: notch, 63-tap FIR, notch, Butterworth low-pass", chainWithFir],
  ["chain: asymmetric 5-tap FIR (taps reversed, Q15 padded to 6), notch", chainAsymmetric],
] as const;

async function prepared(spec: FilterSpec, target: ExportTarget): Promise<PreparedExport> {
  return prepareExport(sourceFor(spec, target, spec.kind === "chain" ? "Chain" : undefined), target);
}

/** 600 LCG words and 200 full-scale steps (gcc-support), 800 in all: 25 blocks of 32, 20 of 40. */
const BITS = { q15: 15, q31: 31 } as const;

describe("cmsis-df1 Q15 and Q31 headers compiled with the documented kernels", () => {
  for (const [label, spec] of DESIGNS) {
    for (const target of ["q15", "q31"] as const) {
      for (const fast of [false, true]) {
        const arithmetic = fast ? "cmsis-fast" : "cmsis";
        it(`${label}, ${target}, ${fast ? "fast kernels" : "standard kernels"}: equal to simulateFixed("${arithmetic}") word for word`, async () => {
          const p = await prepared(spec, target);
          const bits = BITS[target];
          const words = inputWords(bits);
          const expected = simulateFixed(p.quantized, Float64Array.from(words, (w) => w / 2 ** bits), arithmetic);
          const header = renderExport(p, "cmsis-df1").body;
          const got = compileAndRunCmsis(dir, `${p.name}_df1`, header, {
            inputs: words.map(String),
            cType: target === "q15" ? "q15_t" : "q31_t",
            printf: "%lld",
            cast: "long long",
            fast,
            blockSize: spec === peak ? 40 : undefined,
          }).map(Number);
          expect(got).toHaveLength(words.length);
          expect(got).toEqual(Array.from(expected.y, (y) => y * 2 ** bits));
          if (spec === peak && target === "q15") expect(expected.overflows).toBeGreaterThan(0);
        });
      }
    }
  }
});

describe("cmsis-df1 and cmsis-df2t f32 headers compiled with the documented kernels", () => {
  for (const [label, spec] of [DESIGNS[0], DESIGNS[2], DESIGNS[3]]) {
    for (const structure of ["df1", "df2t"] as const) {
      it(`${label}, cmsis-${structure} f32: equal to a float32 model of the documented order (relative 1e-6)`, async () => {
        const p = await prepared(spec, "f32");
        const x = inputWords(15).map((w) => Math.fround(w / 2 ** 15));
        const header = renderExport(p, `cmsis-${structure}`).body;
        const got = compileAndRunCmsis(dir, `${p.name}_${structure}`, header, {
          inputs: x.map((v) => `${v.toPrecision(9)}f`),
          cType: "float32_t",
          printf: "%.9g",
          cast: "double",
        }).map(Number);
        const expected = libraryFloat32(quantizedParts(p.quantized), x, structure);
        expect(got).toHaveLength(x.length);
        got.forEach((g, i) => expect(Math.abs(g - expected[i])).toBeLessThanOrEqual(1e-6 * Math.max(1, Math.abs(expected[i]))));
      });
    }
  }
});

/**
 * The library's float kernels as documented, every operation rounded to float32 (Math.fround), with the
 * feedback added (a1, a2 negated): DF1 y = b0·x + b1·x1 + b2·x2 + a1·y1 + a2·y2 left to right; DF2T
 * y = b0·x + d1, d1 = b1·x + a1·y + d2, d2 = b2·x + a2·y; FIR summed from the oldest sample, from 0.
 */
function libraryFloat32(parts: QuantizedPart[], x: number[], structure: "df1" | "df2t"): number[] {
  const f = Math.fround;
  const runners = parts.map((part) => {
    if (part.taps) {
      const h = part.taps;
      const hist = new Array<number>(h.length).fill(0);
      return (v: number) => {
        hist.pop();
        hist.unshift(v);
        let acc = 0;
        for (let k = h.length - 1; k >= 0; k--) acc = f(acc + f(h[k] * hist[k]));
        return acc;
      };
    }
    const rows = (part.sos ?? []).map(([b0, b1, b2, , a1, a2]) => [b0, b1, b2, -a1, -a2]);
    const st = rows.map(() => [0, 0, 0, 0]);
    return (input: number) =>
      rows.reduce((v, [b0, b1, b2, a1, a2], k) => {
        const s = st[k];
        if (structure === "df1") {
          const y = f(f(f(f(f(b0 * v) + f(b1 * s[0])) + f(b2 * s[1])) + f(a1 * s[2])) + f(a2 * s[3]));
          st[k] = [v, s[0], y, s[2]];
          return y;
        }
        const y = f(f(b0 * v) + s[0]);
        st[k] = [f(f(f(b1 * v) + f(a1 * y)) + s[1]), f(f(b2 * v) + f(a2 * y)), 0, 0];
        return y;
      }, input);
  });
  return x.map((input) => runners.reduce((v, run) => run(v), input));
}
