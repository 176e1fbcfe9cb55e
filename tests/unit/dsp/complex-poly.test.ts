import { describe, expect, it } from "vitest";
import fc from "fast-check";
import type { Complex } from "@/lib/dsp/types";
import { cAbs, cAdd, cArg, cConj, cDiv, cExp, cMul, cNeg, cScale, cSqrt, cSub } from "@/lib/dsp/complex";
import { polyEval, polyFromRoots, polyMul, polyRoots } from "@/lib/dsp/poly";

const close = (a: Complex, b: Complex, tol = 1e-14) => expect(cAbs(cSub(a, b))).toBeLessThanOrEqual(tol * Math.max(1, cAbs(b)));

describe("complex arithmetic (textbook identities)", () => {
  it("basic operations", () => {
    expect(cAdd([1, 2], [3, -4])).toEqual([4, -2]);
    expect(cSub([1, 2], [3, -4])).toEqual([-2, 6]);
    expect(cMul([1, 2], [3, -4])).toEqual([11, 2]);
    close(cDiv([11, 2], [3, -4]), [1, 2]);
    expect(cScale([1, -2], 3)).toEqual([3, -6]);
    expect(cNeg([1, -2])).toEqual([-1, 2]);
    expect(cConj([1, -2])).toEqual([1, 2]);
    expect(cAbs([3, 4])).toBe(5);
    expect(cArg([-1, 0])).toBeCloseTo(Math.PI, 15);
    close(cExp([0, Math.PI]), [-1, 0]);
  });
  it("cDiv does not overflow for huge divisors (Smith 1962)", () => close(cDiv([1e300, 1e300], [1e300, 1e300]), [1, 0]));
  it("cSqrt is the principal root, Re ≥ 0, sign of the imaginary part follows the input", () => {
    close(cSqrt([-4, 0]), [0, 2]);
    close(cSqrt([-4, -0]), [0, -2]);
    close(cSqrt([0, 2]), [1, 1]);
    fc.assert(
      fc.property(fc.double({ min: -1e6, max: 1e6, noNaN: true }), fc.double({ min: -1e6, max: 1e6, noNaN: true }), (re, im) => {
        const r = cSqrt([re, im]);
        expect(r[0]).toBeGreaterThanOrEqual(0);
        close(cMul(r, r), [re, im], 1e-13);
      }),
    );
  });
});

const sortRoots = (rs: Complex[]) => [...rs].sort((a, b) => a[0] - b[0] || a[1] - b[1]);

describe("polynomials (descending powers)", () => {
  it("polyMul and polyEval", () => {
    expect(polyMul([1, 1], [1, -1])).toEqual([1, 0, -1]);
    close(polyEval([1, 0, 1], [0, 1]), [0, 0]);
    close(polyEval([2, -3, 1], [2, 0]), [3, 0]);
  });

  it("polyFromRoots builds the real monic polynomial and refuses unpaired complex roots", () => {
    expect(polyFromRoots([[1, 2], [1, -2], [3, 0]])).toEqual([1, -5, 11, -15]);
    expect(polyFromRoots([])).toEqual([1]);
    expect(() => polyFromRoots([[1, 2]])).toThrow(/conjugate pairs/);
  });

  it("polyRoots: leading zeros dropped, trailing zeros are roots at 0, pairs exactly conjugate", () => {
    const roots = polyRoots([0, 0, 1, 2, 3, 4, 0, 0]);
    expect(roots.filter((r) => r[0] === 0 && r[1] === 0)).toHaveLength(2);
    expect(roots).toHaveLength(5);
    const complex = roots.filter((r) => r[1] !== 0);
    for (const r of complex) expect(complex.some((s) => s[0] === r[0] && s[1] === -r[1])).toBe(true);
    expect(polyRoots([5])).toEqual([]);
    expect(() => polyRoots([0, 0])).toThrow(/zero polynomial/);
    expect(() => polyRoots([1, NaN])).toThrow(/finite/);
  });

  it("polyRoots inverts polyFromRoots for distinct roots on a 1/8 grid (random conjugate-symmetric sets)", () => {
    // Two bounds, both able to fail:
    // - backward error: |p(f)| for every root found is within Horner's rounding bound γ_2n·Σ|c_j||f|^j
    //   (γ_2n ≈ 2n·u, u = ε/2; Higham, Accuracy and Stability of Numerical Algorithms, 2nd ed., §5.1 — from memory),
    //   i.e. f is an exact root of coefficients perturbed by rounding;
    // - forward error: each true root r is found within 16× its first-order sensitivity ε·Σ|c_j||r|^j/|p'(r)|
    //   (Wilkinson, Rounding Errors in Algebraic Processes, 1963, ch. 2 — from memory) plus 1e-12, and never
    //   farther than FORWARD_CAP = 1e-6 however clustered the roots are.
    const FORWARD_CAP = 1e-6;
    const eps = Number.EPSILON;
    const absEval = (c: number[], r: Complex) => c.reduce((acc, cj) => acc * cAbs(r) + Math.abs(cj), 0);
    const derivative = (c: number[]) => c.slice(0, -1).map((cj, j) => cj * (c.length - 1 - j));
    const arbRoot = fc.tuple(fc.integer({ min: -16, max: 16 }), fc.integer({ min: 0, max: 16 }));
    fc.assert(
      fc.property(fc.uniqueArray(arbRoot, { minLength: 1, maxLength: 10, selector: ([re, im]) => `${re},${im}` }), (cells) => {
        const roots: Complex[] = cells.flatMap(([re, im]): Complex[] =>
          im === 0 ? [[re / 8, 0]] : [[re / 8, im / 8], [re / 8, -im / 8]],
        );
        const coeffs = polyFromRoots(roots);
        const degree = coeffs.length - 1;
        const dp = derivative(coeffs);
        const found = polyRoots(coeffs);
        expect(found).toHaveLength(roots.length);
        for (const f of found) expect(cAbs(polyEval(coeffs, f))).toBeLessThanOrEqual(2 * degree * eps * absEval(coeffs, f));
        for (const r of roots) {
          const sensitivity = (eps * absEval(coeffs, r)) / cAbs(polyEval(dp, r));
          const bound = Math.min(FORWARD_CAP, 1e-12 + 16 * sensitivity);
          expect(Math.min(...found.map((f) => cAbs(cSub(f, r))))).toBeLessThanOrEqual(bound);
        }
      }),
      { numRuns: 200 },
    );
  });

  it("polyRoots of zⁿ − 1 for n = 1000 gives the roots of unity (degree ~1000 robustness)", () => {
    const n = 1000;
    const coeffs = new Array<number>(n + 1).fill(0);
    coeffs[0] = 1;
    coeffs[n] = -1;
    const roots = sortRoots(polyRoots(coeffs));
    expect(roots).toHaveLength(n);
    const expected = sortRoots(Array.from({ length: n }, (_, k): Complex => [Math.cos((2 * Math.PI * k) / n), Math.sin((2 * Math.PI * k) / n)]));
    for (const r of roots) {
      const nearest = Math.min(...expected.map((e) => cAbs(cSub(r, e))));
      expect(nearest).toBeLessThan(1e-12);
    }
  });

  it("polyRoots of (x − 1)(x − 2)…(x − 10) (Wilkinson-type, well separated)", () => {
    const roots = sortRoots(polyRoots(polyFromRoots(Array.from({ length: 10 }, (_, i): Complex => [i + 1, 0]))));
    roots.forEach((r, i) => expect(Math.abs(r[0] - (i + 1))).toBeLessThan(1e-6));
  });
  it("polyRoots of a multiple root: the cluster's mean is the root itself, so |p| away from it keeps its accuracy", () => {
    // (z + 1)³ and (z + 1)⁸: the computed members scatter by about ε^(1/m) (Wilkinson, Rounding Errors in
    // Algebraic Processes, 1963, ch. 2; from memory), their mean must still be −1 (exact algebra).
    for (const m of [3, 8]) {
      const roots = polyRoots(polyFromRoots(Array.from({ length: m }, (): Complex => [-1, 0])));
      const mean = cScale(roots.reduce((s, r) => cAdd(s, r), [0, 0] as Complex), 1 / m);
      close(mean, [-1, 0], 1e-13);
    }
    // z³ − 3.0000001z² + 3.0000002z − 1.0000001 = (z − 1)²(z − 1 − 10⁻⁷) (exact algebra): mean 1 + 10⁻⁷/3
    // up to the rounding of the decimal coefficients (ε · Σ|a_k| ≈ 2e-15, times the cluster's gain).
    const near = polyRoots([1, -3.0000001, 3.0000002, -1.0000001]);
    const nearMean = near.reduce((s, r) => s + r[0], 0) / 3;
    expect(Math.abs(nearMean - (1 + 1e-7 / 3))).toBeLessThan(1e-12);
    // Distinct close roots keep their own places: (z − 0.999)(z − 1)(z − 1.001).
    const spread = sortRoots(polyRoots(polyFromRoots([[0.999, 0], [1, 0], [1.001, 0]])));
    [0.999, 1, 1.001].forEach((e, i) => expect(Math.abs(spread[i][0] - e)).toBeLessThan(1e-9));
  });
});
