import { describe, expect, it } from "vitest";
import fixture from "../../fixtures/dsp/designs-cont2discrete.json";
import { cAbs, cArg, cDiv } from "@/lib/dsp/complex";
import { discretize, type DiscretizationMethod } from "@/lib/dsp/discretize/discretize";
import { characteristicPolynomial, expm } from "@/lib/dsp/linalg";
import { polyEval, polyRoots } from "@/lib/dsp/poly";
import type { Complex } from "@/lib/dsp/types";

const TWO_PI = 2 * Math.PI;

/** H(z) from coefficients of z⁰ … z⁻ⁿ at z = e^{jω}. */
function digitalAt(b: number[], a: number[], omega: number): Complex {
  const z: Complex = [Math.cos(omega), Math.sin(omega)];
  return cDiv(polyEval(b, z), polyEval(a, z));
}

/** |actual − expected| ≤ rel·max|expected| + floor, element by element. */
function expectCloseRelativeToMax(actual: number[], expected: number[], rel: number, floor = 0): void {
  expect(actual).toHaveLength(expected.length);
  const scale = Math.max(...expected.map(Math.abs));
  actual.forEach((v, i) => expect(Math.abs(v - expected[i])).toBeLessThanOrEqual(rel * scale + floor));
}

const maxAbs = (xs: number[]) => Math.max(...xs.map(Math.abs));

describe("discretize against scipy.signal.cont2discrete / bilinear and the generator's matched_zpk", () => {
  const tol = fixture.tolerance;
  for (const c of fixture.cases) {
    it(`${c.method}: ${c.label} at ${c.sampleRateHz} Hz — ${c.call}`, () => {
      const opts = "prewarpHz" in c ? { prewarpHz: c.prewarpHz as number } : {};
      const { b, a } = discretize({ num: c.num, den: c.den }, c.sampleRateHz, c.method as DiscretizationMethod, opts);
      expect(a[0]).toBe(1);
      // scipy's own numerator error floor scales with max|a| (see the fixture's tolerance note).
      expectCloseRelativeToMax(b, c.b, tol.coefficientRelativeToMax, tol.scipyNumeratorFloor * maxAbs(c.a));
      expectCloseRelativeToMax(a, c.a, tol.coefficientRelativeToMax);
      if ("exactB" in c && "exactA" in c) {
        expectCloseRelativeToMax(b, c.exactB as number[], tol.exactRelativeToMax);
        expectCloseRelativeToMax(a, c.exactA as number[], tol.exactRelativeToMax);
      }
    });
  }
});

describe("published check values", () => {
  const a = TWO_PI * 10;
  it("ZOH of a/(s+a), a = 2π·10, T = 1 ms: b1 = 1 − e^{−aT} = 0.0608986, a1 = −e^{−aT} = −0.9391014 (closed form of the step-invariant transform; common practice)", () => {
    const r = discretize({ num: [a], den: [1, a] }, 1000, "zoh");
    expect(r.b[0]).toBe(0);
    expect(r.b[1]).toBeCloseTo(0.0608986, 7);
    expect(r.a[1]).toBeCloseTo(-0.9391014, 7);
  });

  it("Tustin of a/(s+a): b0 = b1 = aT/(2+aT) = 0.0304590, a1 = (aT − 2)/(aT + 2) = −0.9390819 (closed form; common practice)", () => {
    const r = discretize({ num: [a], den: [1, a] }, 1000, "tustin");
    expect(r.b[0]).toBeCloseTo(0.030459, 7);
    expect(r.b[1]).toBeCloseTo(0.030459, 7);
    expect(r.a[1]).toBeCloseTo(-0.9390819, 7);
  });

  it("ZOH maps poles exactly: ωn = 2π·50, ζ = 0.1, T = 1 ms → |z| = e^{−ζωnT} = 0.969072, ∠z = ωn√(1−ζ²)T = 0.312585 rad (z = e^{sT}; common practice)", () => {
    const wn = TWO_PI * 50;
    const r = discretize({ num: [wn * wn], den: [1, 2 * 0.1 * wn, wn * wn] }, 1000, "zoh");
    for (const p of polyRoots(r.a)) {
      expect(cAbs(p)).toBeCloseTo(0.969072, 6);
      expect(Math.abs(cArg(p))).toBeCloseTo(0.312585, 6);
    }
  });

  it("PID derivative filter s/(Tf·s+1), Tf = 0.4 ms, h = 1 ms: poles backward Tf/(Tf+h) = 0.2857, Tustin (2Tf−h)/(2Tf+h) = −0.1111, ZOH e^{−h/Tf} = 0.0821, forward 1 − h/Tf = −1.5 (closed forms; common practice)", () => {
    const tf = { num: [1, 0], den: [0.4e-3, 1] };
    const pole = (m: DiscretizationMethod) => -discretize(tf, 1000, m).a[1];
    expect(pole("backward-euler")).toBeCloseTo(0.2857, 4);
    expect(pole("tustin")).toBeCloseTo(-0.1111, 4);
    expect(pole("zoh")).toBeCloseTo(0.0821, 4);
    expect(pole("forward-euler")).toBeCloseTo(-1.5, 12);
  });

  it("prewarped Tustin is exact at the prewarp frequency: analog H(j·2πf0) equals digital H(e^{j2πf0/fs}) in magnitude and phase (Franklin, Powell & Workman, Digital Control of Dynamic Systems, 3rd ed., §6.3.1)", () => {
    const wn = TWO_PI * 120;
    const tf = { num: [2 * 0.05 * wn, 0], den: [1, 2 * 0.05 * wn, wn * wn] };
    for (const f0 of [60, 120, 300, 450]) {
      const fs = 1000;
      const { b, a } = discretize(tf, fs, "tustin-prewarp", { prewarpHz: f0 });
      const analog = cDiv(polyEval(tf.num, [0, TWO_PI * f0]), polyEval(tf.den, [0, TWO_PI * f0]));
      const digital = digitalAt(b, a, (TWO_PI * f0) / fs);
      expect(cAbs(digital)).toBeCloseTo(cAbs(analog), 12);
      expect(cArg(digital)).toBeCloseTo(cArg(analog), 10);
    }
  });

  it("plain Tustin warps: a first-order 200 Hz low-pass at 1 kHz is −3.687 dB at 200 Hz, prewarped −3.0103 dB (closed form: Tustin maps f to (fs/π)·tan(πf/fs); common practice)", () => {
    const wc = TWO_PI * 200;
    const tf = { num: [wc], den: [1, wc] };
    const db = (r: { b: number[]; a: number[] }) => 20 * Math.log10(cAbs(digitalAt(r.b, r.a, TWO_PI * 0.2)));
    expect(db(discretize(tf, 1000, "tustin"))).toBeCloseTo(-3.687, 3);
    expect(db(discretize(tf, 1000, "tustin-prewarp", { prewarpHz: 200 }))).toBeCloseTo(-3.0103, 4);
  });
});

describe("matched pole-zero", () => {
  it("a/(s+a) gives the ZOH result: one zero at infinity stays (modified matched, Franklin, Powell & Workman, Digital Control of Dynamic Systems, 3rd ed., §6.3.3)", () => {
    const a = TWO_PI * 10;
    const m = discretize({ num: [a], den: [1, a] }, 1000, "matched");
    const z = discretize({ num: [a], den: [1, a] }, 1000, "zoh");
    expectCloseRelativeToMax(m.b, z.b, 1e-14);
    expectCloseRelativeToMax(m.a, z.a, 1e-14);
  });

  it("1/s matches the low-frequency asymptote instead of an infinite DC gain: T·z⁻¹/(1 − z⁻¹)", () => {
    const r = discretize({ num: [1], den: [1, 0] }, 500, "matched");
    expect(r.b).toEqual([0, 0.002]);
    expect(r.a).toEqual([1, -1]);
  });

  it("s/(s+a) (zero at s = 0) is finite and matches |H| as f → 0", () => {
    const a = TWO_PI * 10;
    const r = discretize({ num: [1, 0], den: [1, a] }, 1000, "matched");
    [...r.b, ...r.a].forEach((c) => expect(Number.isFinite(c)).toBe(true));
    const f = 0.01;
    const analog = cAbs(cDiv([0, TWO_PI * f], [a, TWO_PI * f]));
    expect(cAbs(digitalAt(r.b, r.a, (TWO_PI * f) / 1000)) / analog).toBeCloseTo(1, 5);
  });

  it("DC gains agree for a lead network and a resonance: H(z = 1) = H(s = 0)", () => {
    const wn = TWO_PI * 50;
    for (const tf of [{ num: [1, 10], den: [1, 100] }, { num: [wn * wn], den: [1, 2 * 0.1 * wn, wn * wn] }]) {
      const r = discretize(tf, 1000, "matched");
      const dcDigital = r.b.reduce((s, c) => s + c, 0) / r.a.reduce((s, c) => s + c, 0);
      expect(dcDigital).toBeCloseTo(tf.num[tf.num.length - 1] / tf.den[tf.den.length - 1], 12);
    }
  });

  it("zeros at infinity: r − 1 of them map to z = −1 (third-order all-pole → two zeros at −1)", () => {
    const r = discretize({ num: [1], den: [1, 2, 2, 1] }, 10, "matched");
    expect(r.b[0]).toBe(0);
    const zeros = polyRoots(r.b.slice(1));
    expect(zeros).toHaveLength(2);
    zeros.forEach((z) => {
      expect(z[0]).toBeCloseTo(-1, 12);
      expect(z[1]).toBeCloseTo(0, 12);
    });
  });
});

describe("discretize edge cases and refusals", () => {
  it("a static gain stays a static gain (scipy's tf2ss adds a cancelling state instead)", () => {
    for (const m of ["forward-euler", "backward-euler", "tustin", "zoh", "matched"] as const) {
      expect(discretize({ num: [3], den: [2] }, 100, m)).toEqual({ b: [1.5], a: [1] });
    }
  });

  it("leading zeros of num and den are ignored", () => {
    const r1 = discretize({ num: [0, 0, 5], den: [0, 1, 5] }, 100, "zoh");
    const r2 = discretize({ num: [5], den: [1, 5] }, 100, "zoh");
    expect(r1).toEqual(r2);
  });

  it("refuses an improper H(s)", () => {
    expect(() => discretize({ num: [1, 0, 0], den: [1, 1] }, 100, "tustin")).toThrow(/improper.*degree 2.*degree 1/);
  });

  it("refuses non-finite or empty polynomials and bad sample rates", () => {
    expect(() => discretize({ num: [NaN], den: [1, 1] }, 100, "tustin")).toThrow(/num coefficients must be finite/);
    expect(() => discretize({ num: [1], den: [] }, 100, "tustin")).toThrow(/den must have at least one/);
    expect(() => discretize({ num: [1], den: [0, 0] }, 100, "tustin")).toThrow(/den must have a nonzero/);
    expect(() => discretize({ num: [1], den: [1, 1] }, 0, "tustin")).toThrow(/sampleRateHz must be a finite number above 0/);
    expect(() => discretize({ num: [1], den: [1, 1] }, Infinity, "zoh")).toThrow(/sampleRateHz/);
  });

  it("tustin-prewarp needs 0 < prewarpHz < fs/2; other methods refuse prewarpHz", () => {
    const tf = { num: [1], den: [1, 1] };
    expect(() => discretize(tf, 100, "tustin-prewarp")).toThrow(/prewarpHz must be above 0 and below the Nyquist frequency 50 Hz/);
    expect(() => discretize(tf, 100, "tustin-prewarp", { prewarpHz: 50 })).toThrow(/below the Nyquist/);
    expect(() => discretize(tf, 100, "tustin", { prewarpHz: 10 })).toThrow(/only used by the 'tustin-prewarp'/);
  });

  it("refuses a den root that the method maps to z = ∞ (Tustin: s = 2·fs) instead of returning NaN", () => {
    expect(() => discretize({ num: [1], den: [1, -200] }, 100, "tustin")).toThrow(/root at s = 200 rad\/s/);
  });
});

describe("repeated poles need no root finding", () => {
  it("ZOH and matched of a⁴/(s+a)⁴ have the denominator (z − e^{−aT})⁴ (binomial coefficients), a = 2π·10, fs = 1 kHz", () => {
    const a = TWO_PI * 10;
    const den = [1, 4 * a, 6 * a ** 2, 4 * a ** 3, a ** 4];
    const r = Math.exp(-a / 1000);
    const expected = [1, -4 * r, 6 * r ** 2, -4 * r ** 3, r ** 4];
    for (const m of ["zoh", "matched"] as const) {
      expectCloseRelativeToMax(discretize({ num: [a ** 4], den }, 1000, m).a, expected, 1e-14);
    }
  });

  it("characteristicPolynomial of a Jordan-like block keeps a four-fold eigenvalue exact", () => {
    const m = [[2, 1, 0, 0], [0, 2, 1, 0], [0, 0, 2, 1], [0, 0, 0, 2]];
    expect(characteristicPolynomial(m)).toEqual([1, -8, 24, -32, 16]);
  });
});

describe("expm (scaling and squaring, Padé 13)", () => {
  it("matches the closed form for a rotation generator and a Jordan block", () => {
    const t = 7.3;
    const rot = expm([[0, -t], [t, 0]]);
    expect(rot[0][0]).toBeCloseTo(Math.cos(t), 13);
    expect(rot[1][0]).toBeCloseTo(Math.sin(t), 13);
    const jordan = expm([[-2, 1], [0, -2]]);
    expect(jordan[0][0]).toBeCloseTo(Math.exp(-2), 15);
    expect(jordan[0][1]).toBeCloseTo(Math.exp(-2), 15);
    expect(jordan[1][0]).toBe(0);
  });
});
