import type { Complex } from "./types";
import { cAbs, cAdd, cConj, cDiv, cMul, cScale, cSub } from "./complex";
import { refineMultipleRoots } from "./root-clusters";

/**
 * Polynomials with real coefficients in DESCENDING powers: [a0, a1, …, an] is a0·xⁿ + … + an
 * (numpy.poly1d convention).
 */

/** Product of two polynomials (discrete convolution of the coefficient lists). */
export function polyMul(a: number[], b: number[]): number[] {
  if (a.length === 0 || b.length === 0) return [];
  const out = new Array<number>(a.length + b.length - 1).fill(0);
  for (let i = 0; i < a.length; i++) {
    for (let j = 0; j < b.length; j++) out[i + j] += a[i] * b[j];
  }
  return out;
}

/** Horner evaluation of a real polynomial at a complex point. */
export function polyEval(coeffs: number[], x: Complex): Complex {
  let acc: Complex = [0, 0];
  for (const c of coeffs) acc = cAdd(cMul(acc, x), [c, 0]);
  return acc;
}

/** Imaginary residue allowed in polyFromRoots, relative to the coefficients of Π(x + |r|). */
const CONJUGATE_TOLERANCE = 1e-8;

/**
 * Monic real polynomial Π(x − r) (numpy.poly convention). The roots must come in conjugate pairs:
 * the imaginary part of every coefficient must be below 1e-8 of the matching coefficient of
 * Π(x + |r|), which bounds it; it is then dropped. Throws otherwise.
 */
export function polyFromRoots(roots: Complex[]): number[] {
  let re: number[] = [1];
  let im: number[] = [0];
  let bound: number[] = [1];
  for (const r of roots) {
    const nextRe = new Array<number>(re.length + 1).fill(0);
    const nextIm = new Array<number>(re.length + 1).fill(0);
    const nextBound = new Array<number>(re.length + 1).fill(0);
    const rAbs = cAbs(r);
    for (let i = 0; i < re.length; i++) {
      nextRe[i] += re[i];
      nextIm[i] += im[i];
      nextBound[i] += bound[i];
      const [pr, pi] = cMul([re[i], im[i]], r);
      nextRe[i + 1] -= pr;
      nextIm[i + 1] -= pi;
      nextBound[i + 1] += bound[i] * rAbs;
    }
    re = nextRe;
    im = nextIm;
    bound = nextBound;
  }
  im.forEach((v, i) => {
    if (Math.abs(v) > CONJUGATE_TOLERANCE * bound[i]) {
      throw new Error(
        `polyFromRoots: roots are not in conjugate pairs (coefficient ${i} has imaginary part ${v}; ` +
          `allowed at most ${CONJUGATE_TOLERANCE} × ${bound[i]})`,
      );
    }
  });
  return re;
}

const EPS = Number.EPSILON;
const MAX_ABERTH_ITERATIONS = 500;

/**
 * All complex roots of a real polynomial (descending powers), with multiplicity.
 * Leading zero coefficients are dropped; trailing zero coefficients are roots at exactly 0.
 * Method: Aberth–Ehrlich simultaneous iteration (Aberth 1973, Math. Comp. 27(122)) started from
 * Bini's Newton-polygon circles (Bini 1996, Numer. Algorithms 13:179–200); each root takes one last
 * correction once |p(z)| is within the Horner rounding bound; roots scattered inside the rounding disc of a
 * multiple root are replaced by that root (refineMultipleRoots); then conjugate pairs are made exactly conjugate and
 * near-real leftovers exactly real. Throws for the zero polynomial or non-finite coefficients.
 */
export function polyRoots(coeffs: number[]): Complex[] {
  if (coeffs.some((c) => !Number.isFinite(c))) {
    throw new Error("polyRoots: coefficients must be finite numbers");
  }
  const first = coeffs.findIndex((c) => c !== 0);
  if (first < 0) throw new Error("polyRoots: the zero polynomial has no defined roots");
  let last = coeffs.length - 1;
  while (coeffs[last] === 0) last--;
  const zerosAtOrigin = coeffs.length - 1 - last;
  const a = coeffs.slice(first, last + 1);
  const roots = solveNonzeroConstant(a);
  for (let i = 0; i < zerosAtOrigin; i++) roots.push([0, 0]);
  return roots;
}

function solveNonzeroConstant(a: number[]): Complex[] {
  const n = a.length - 1;
  if (n === 0) return [];
  if (n === 1) return [[-a[1] / a[0], 0]];
  if (n === 2) return quadraticRoots(a[0], a[1], a[2]);
  return makeConjugateSymmetric(refineMultipleRoots(a, aberth(a, initialGuesses(a))));
}

/** Roots of a·x² + b·x + c without cancellation (Press et al., Numerical Recipes §5.6). */
function quadraticRoots(a: number, b: number, c: number): Complex[] {
  const disc = b * b - 4 * a * c;
  if (disc >= 0) {
    const q = -0.5 * (b + Math.sign(b || 1) * Math.sqrt(disc));
    const r1 = q / a;
    const r2 = c / q;
    return [[r1, 0], [r2, 0]];
  }
  const re = -b / (2 * a);
  const im = Math.sqrt(-disc) / (2 * Math.abs(a));
  return [[re, im], [re, -im]];
}

/**
 * Starting points on the circles given by the upper convex hull of (k, log|a_k|) over ascending powers
 * (Bini 1996, §3): each hull edge from k to m gives m − k points of radius (|a_k|/|a_m|)^(1/(m−k)).
 */
function initialGuesses(descending: number[]): Complex[] {
  const n = descending.length - 1;
  const asc = descending.slice().reverse();
  const pts: Array<[number, number]> = [];
  asc.forEach((c, k) => {
    if (c !== 0) pts.push([k, Math.log(Math.abs(c))]);
  });
  const hull: Array<[number, number]> = [];
  for (const p of pts) {
    while (hull.length >= 2) {
      const [x1, y1] = hull[hull.length - 2];
      const [x2, y2] = hull[hull.length - 1];
      if ((x2 - x1) * (p[1] - y1) - (y2 - y1) * (p[0] - x1) >= 0) hull.pop();
      else break;
    }
    hull.push(p);
  }
  const guesses: Complex[] = [];
  const offset = 0.7;
  for (let h = 0; h + 1 < hull.length; h++) {
    const [k, yk] = hull[h];
    const [m, ym] = hull[h + 1];
    const count = m - k;
    const radius = Math.exp((yk - ym) / count);
    for (let i = 0; i < count; i++) {
      const angle = (2 * Math.PI * i) / count + (2 * Math.PI * h) / n + offset;
      guesses.push([radius * Math.cos(angle), radius * Math.sin(angle)]);
    }
  }
  return guesses;
}

/**
 * Newton quotient p(z)/p'(z) and whether |p(z)| is at the level of Horner's rounding error
 * (Higham, Accuracy and Stability of Numerical Algorithms §5.1). Values are rescaled on the fly
 * so that degree-1000 polynomials evaluated off the unit circle do not overflow.
 */
function newtonStep(a: number[], z: Complex): { step: Complex; converged: boolean } {
  let p: Complex = [a[0], 0];
  let dp: Complex = [0, 0];
  let bound = Math.abs(a[0]);
  let scale = 1;
  const rz = cAbs(z);
  for (let k = 1; k < a.length; k++) {
    dp = cAdd(cMul(dp, z), p);
    p = cAdd(cMul(p, z), [a[k] / scale, 0]);
    bound = bound * rz + Math.abs(a[k]) / scale;
    const big = Math.max(cAbs(p), cAbs(dp), bound);
    if (big > 1e100) {
      p = cScale(p, 1e-100);
      dp = cScale(dp, 1e-100);
      bound *= 1e-100;
      scale *= 1e100;
    }
  }
  const converged = cAbs(p) <= 4 * a.length * EPS * bound;
  if (p[0] === 0 && p[1] === 0) return { step: [0, 0], converged: true };
  return { step: cDiv(p, dp), converged };
}

function aberth(a: number[], start: Complex[]): Complex[] {
  const z = start.map((s): Complex => [s[0], s[1]]);
  const done = z.map(() => false);
  for (let iter = 0; iter < MAX_ABERTH_ITERATIONS && done.some((d) => !d); iter++) {
    for (let i = 0; i < z.length; i++) {
      if (done[i]) continue;
      const { step, converged } = newtonStep(a, z[i]);
      if (step[0] === 0 && step[1] === 0) {
        done[i] = true;
        continue;
      }
      let repulsion: Complex = [0, 0];
      for (let j = 0; j < z.length; j++) {
        if (j !== i) repulsion = cAdd(repulsion, cDiv([1, 0], cSub(z[i], z[j])));
      }
      const correction = cDiv(step, cSub([1, 0], cMul(step, repulsion)));
      z[i] = cSub(z[i], correction);
      // One more correction after the residual reaches rounding level polishes the root (Newton polishing).
      if (converged || cAbs(correction) <= EPS * cAbs(z[i])) done[i] = true;
    }
  }
  if (z.some((r) => !Number.isFinite(r[0]) || !Number.isFinite(r[1]))) {
    throw new Error("polyRoots: root iteration diverged");
  }
  return z;
}

/**
 * Real coefficients give roots in conjugate pairs: pair each upper-half-plane root with the nearest
 * lower-half-plane root to its conjugate and replace both by their mean; roots left unpaired are
 * real up to rounding and get imaginary part 0.
 */
function makeConjugateSymmetric(roots: Complex[]): Complex[] {
  const upper = roots.filter((r) => r[1] > 0).sort((p, q) => q[1] - p[1]);
  const lower = roots.filter((r) => r[1] < 0);
  const out: Complex[] = roots.filter((r) => r[1] === 0);
  const used = lower.map(() => false);
  for (const u of upper) {
    let best = -1;
    let bestDist = Infinity;
    lower.forEach((l, j) => {
      const d = cAbs(cSub(l, cConj(u)));
      if (!used[j] && d < bestDist) {
        best = j;
        bestDist = d;
      }
    });
    if (best >= 0 && bestDist <= Math.max(u[1], 1e-6 * cAbs(u))) {
      used[best] = true;
      const mean = cScale(cAdd(u, cConj(lower[best])), 0.5);
      out.push(mean, cConj(mean));
    } else {
      out.push([u[0], 0]);
    }
  }
  lower.forEach((l, j) => {
    if (!used[j]) out.push([l[0], 0]);
  });
  return out;
}
