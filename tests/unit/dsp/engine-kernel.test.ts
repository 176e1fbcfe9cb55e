import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { filterSignal } from "@/lib/dsp/engine/filter-signal";
import { firKernel, genericFirKernel, MAX_UNROLLED_TAPS } from "@/lib/dsp/engine/fir-kernel";
import { packSos } from "@/lib/dsp/engine/sos-coefficients";
import { genericSosKernel, MAX_UNROLLED_SECTIONS, sosKernel } from "@/lib/dsp/engine/sos-kernel";
import { createStreamingFilter } from "@/lib/dsp/engine/streaming-filter";

const base = { sampleRateHz: 1000, zeros: [], poles: [], gain: 1 };
const coefficient = fc.double({ min: -1.9, max: 1.9, noNaN: true });
const row = fc.tuple(coefficient, coefficient, coefficient, fc.double({ min: -1.2, max: 1.2, noNaN: true }), fc.double({ min: 0, max: 0.6, noNaN: true }));

describe("SOS kernels", () => {
  it("the generated kernel and the generic loop agree bit for bit, states included", () => {
    fc.assert(
      fc.property(fc.array(row, { minLength: 1, maxLength: 8 }), fc.array(fc.double({ min: -5, max: 5, noNaN: true }), { maxLength: 100 }), (rows, xs) => {
        const packed = Float64Array.from(rows.flat());
        const x = Float64Array.from(xs);
        const run = (kernel: ReturnType<typeof sosKernel>) => {
          const y = new Float64Array(x.length);
          const z = Float64Array.from({ length: rows.length * 2 }, (_, i) => (i % 3) - 1);
          kernel(x, y, 0, x.length, z);
          return [y, z];
        };
        expect(run(sosKernel(packed))).toEqual(run(genericSosKernel(packed)));
      }),
    );
  });

  it("keeps signed zero coefficients exact in generated source", () => {
    const packed = Float64Array.of(-0, 1, -0, -0, 0);
    const x = Float64Array.of(-0, 0, -0);
    const [a, b] = [new Float64Array(3), new Float64Array(3)];
    sosKernel(packed)(x, a, 0, 3, new Float64Array(2));
    genericSosKernel(packed)(x, b, 0, 3, new Float64Array(2));
    expect(Array.from(a, (v) => Object.is(v, -0))).toEqual(Array.from(b, (v) => Object.is(v, -0)));
  });

  it("refuses to generate code from non-finite numbers", () => {
    expect(() => sosKernel(Float64Array.of(1, 0, 0, NaN, 0))).toThrow(/finite/);
    expect(() => sosKernel(Float64Array.of(1, 0, 0, 0, Infinity))).toThrow(/finite/);
  });

  it("uses the generic loop for very long cascades, with the same results", () => {
    const sections = MAX_UNROLLED_SECTIONS + 2;
    const sos = Array.from({ length: sections }, (_, s) => [1, 0.1 * (s % 3), 0, 1, -0.2, 0.01 * (s % 5)]);
    const x = Float64Array.from({ length: 64 }, (_, i) => Math.cos(i));
    const packed = packSos(sos);
    const y = new Float64Array(64);
    genericSosKernel(packed)(x, y, 0, 64, new Float64Array(sections * 2));
    expect(filterSignal({ ...base, sos }, x)).toEqual(y);
  });
});

describe("FIR kernels", () => {
  const runFir = (kernel: ReturnType<typeof firKernel>, buf: Float64Array, taps: number) => {
    const y = new Float64Array(buf.length - taps + 1);
    kernel(buf, y, taps - 1, y.length, 0);
    return y;
  };

  it("the generated kernel and the generic loop agree bit for bit", () => {
    fc.assert(
      fc.property(
        fc.array(fc.double({ min: -2, max: 2, noNaN: true }), { minLength: 1, maxLength: MAX_UNROLLED_TAPS }),
        fc.array(fc.double({ min: -5, max: 5, noNaN: true }), { minLength: 0, maxLength: 60 }),
        (taps, xs) => {
          const h = Float64Array.from(taps);
          const buf = Float64Array.from([...new Array<number>(taps.length - 1).fill(0.25), ...xs]);
          expect(runFir(firKernel(h), buf, taps.length)).toEqual(runFir(genericFirKernel(h), buf, taps.length));
        },
      ),
    );
  });

  it("uses the generic loop for long filters, with the same results as a direct sum", () => {
    const taps = Array.from({ length: MAX_UNROLLED_TAPS + 5 }, (_, k) => 1 / (k + 1));
    const x = Float64Array.from({ length: 100 }, (_, i) => Math.sin(i));
    const y = filterSignal({ ...base, taps }, x);
    const direct = Array.from(x, (_, n) => taps.reduce((acc, h, k) => acc + h * (n - k >= 0 ? x[n - k] : 0), 0));
    expect(Array.from(y)).toEqual(direct);
  });

  it("refuses to generate code from non-finite taps", () => {
    expect(() => firKernel(Float64Array.of(1, NaN))).toThrow(/finite/);
  });
});

describe("design validation", () => {
  it("needs exactly one of sos, taps and ba", () => {
    expect(() => filterSignal(base, new Float64Array(3))).toThrow(/exactly one of sos, taps and ba/);
    expect(() => filterSignal({ ...base, sos: [[1, 0, 0, 1, 0, 0]], taps: [1] }, new Float64Array(3))).toThrow(/exactly one/);
  });

  it("rejects malformed sections and taps with the allowed form", () => {
    expect(() => packSos([])).toThrow(/at least 1 section/);
    expect(() => packSos([[1, 0, 0, 1, 0]])).toThrow(/6 entries/);
    expect(() => packSos([[1, 0, 0, 2, 0, 0]])).toThrow(/a0 = 1/);
    expect(() => packSos([[1, NaN, 0, 1, 0, 0]])).toThrow(/finite/);
    expect(() => filterSignal({ ...base, taps: [] }, new Float64Array(3))).toThrow(/at least 1/);
    expect(() => filterSignal({ ...base, taps: [1, Infinity] }, new Float64Array(3))).toThrow(/finite/);
  });

  it("rejects a step start when a section has a pole at z = 1 (no finite steady state)", () => {
    const integrator = { ...base, sos: [[1, 0, 0, 1, -1, 0]] };
    expect(() => createStreamingFilter(integrator, { initial: "step" })).toThrow(/1 \+ a1 \+ a2 = 0/);
    expect(() => createStreamingFilter(integrator)).not.toThrow();
  });

  it("rejects an unknown initial mode and a wrong-length output buffer", () => {
    const d = { ...base, taps: [1] };
    expect(() => createStreamingFilter(d, { initial: "ramp" as "zero" })).toThrow(/'zero' or 'step'/);
    expect(() => createStreamingFilter(d).process(new Float64Array(4), new Float64Array(3))).toThrow(/4 entries/);
  });
});

describe("code generation turned off (the browser under the app's CSP)", () => {
  it("never calls the Function constructor again and gives the generic loop's output bit for bit", async () => {
    const { refuseCodeGeneration } = await import("@/lib/dsp/engine/codegen");
    const packed = Float64Array.from([0.2, 0.4, 0.2, -0.5, 0.3, 0.1, 0.0, -0.1, 0.2, 0.05]);
    const x = Float64Array.from({ length: 50 }, (_, i) => Math.sin(i / 3));
    const run = (kernel: ReturnType<typeof sosKernel>) => {
      const y = new Float64Array(x.length);
      kernel(x, y, 0, x.length, new Float64Array(4));
      return y;
    };
    const generated = run(sosKernel(packed));
    refuseCodeGeneration();
    const original = globalThis.Function;
    let calls = 0;
    globalThis.Function = new Proxy(original, { construct: (target, args) => (calls++, Reflect.construct(target, args)) });
    try {
      expect(run(sosKernel(Float64Array.from([...packed].map((c) => c / 2))))).toEqual(run(genericSosKernel(Float64Array.from([...packed].map((c) => c / 2)))));
      expect(run(sosKernel(packed))).toEqual(generated);
      expect(calls).toBe(0);
    } finally {
      globalThis.Function = original;
    }
  });
});
