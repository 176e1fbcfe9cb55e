import type { Complex } from "../types";
import { cAbs, cConj, cScale, cAdd, cSub } from "../complex";

/** Relative tolerance for "real" and "conjugate pair": 100·eps (scipy.signal _cplxreal convention). */
const PAIR_TOLERANCE = 100 * Number.EPSILON;

const isReal = (x: Complex): boolean => x[1] === 0;

/**
 * Split points into one representative (positive imaginary part, averaged with its partner) per conjugate
 * pair, sorted by real part then |imag|, followed by the real points sorted by value
 * (scipy.signal _cplxreal convention). Throws when a complex point has no conjugate.
 */
function conjugatePairsThenReals(points: Complex[]): Complex[] {
  const sorted = points
    .map((x, i) => ({ x, i }))
    .sort((a, b) => a.x[0] - b.x[0] || Math.abs(a.x[1]) - Math.abs(b.x[1]) || a.i - b.i)
    .map(({ x }) => x);
  const realMask = sorted.map((x) => Math.abs(x[1]) <= PAIR_TOLERANCE * cAbs(x));
  const reals = sorted.filter((_, i) => realMask[i]).map((x): Complex => [x[0], 0]);
  const rest = sorted.filter((_, i) => !realMask[i]);
  const upper = rest.filter((x) => x[1] > 0);
  const lower = rest.filter((x) => x[1] < 0);
  if (upper.length !== lower.length) throw new Error("zpk2sos: a complex value has no matching conjugate");
  let start = 0;
  for (let i = 1; i <= upper.length; i++) {
    const sameReal =
      i < upper.length && upper[i][0] - upper[i - 1][0] <= PAIR_TOLERANCE * cAbs(upper[i - 1]);
    if (!sameReal) {
      sortRunByImag(upper, start, i);
      sortRunByImag(lower, start, i);
      start = i;
    }
  }
  const pairs = upper.map((u, i) => {
    if (cAbs(cSub(u, cConj(lower[i]))) > PAIR_TOLERANCE * cAbs(lower[i])) {
      throw new Error("zpk2sos: a complex value has no matching conjugate");
    }
    return cScale(cAdd(u, cConj(lower[i])), 0.5);
  });
  return [...pairs, ...reals];
}

function sortRunByImag(xs: Complex[], start: number, stop: number): void {
  const run = xs.slice(start, stop).sort((a, b) => Math.abs(a[1]) - Math.abs(b[1]));
  xs.splice(start, run.length, ...run);
}

/** Index of the point nearest to `to` among those of the requested kind (first on ties). */
function nearestIndex(from: Complex[], to: Complex, which: "real" | "complex" | "any"): number {
  let best = -1;
  let bestDist = Infinity;
  from.forEach((x, i) => {
    if (which === "real" && !isReal(x)) return;
    if (which === "complex" && isReal(x)) return;
    const d = cAbs(cSub(x, to));
    if (d < bestDist) {
      best = i;
      bestDist = d;
    }
  });
  if (best < 0) throw new Error(`zpk2sos: no ${which} point left to pair`);
  return best;
}

/** Index of the pole closest to the unit circle (first on ties). */
function worstIndex(poles: Complex[], candidates: number[]): number {
  let best = candidates[0];
  for (const i of candidates) {
    if (Math.abs(1 - cAbs(poles[i])) < Math.abs(1 - cAbs(poles[best]))) best = i;
  }
  return best;
}

function take(xs: Complex[], i: number): Complex {
  return xs.splice(i, 1)[0];
}

/** Monic quadratic (or linear, padded with a leading 0) from a conjugate pair, two reals, or one real. */
function quadratic(roots: Complex[]): [number, number, number] {
  if (roots.length === 1) return [0, 1, -roots[0][0]];
  const [r1, r2] = roots;
  if (!isReal(r1)) return [1, -2 * r1[0], r1[0] * r1[0] + r1[1] * r1[1]];
  return [1, -(r1[0] + r2[0]), r1[0] * r2[0]];
}

function section(zeros: Complex[], poles: Complex[]): number[] {
  return [...quadratic(zeros), ...quadratic(poles)];
}

const realIndices = (xs: Complex[]): number[] => xs.flatMap((x, i) => (isReal(x) ? [i] : []));

/**
 * Digital zeros/poles/gain → second-order sections, rows [b0, b1, b2, 1, a1, a2], with the whole gain in
 * the first row. Pairing and ordering follow scipy.signal.zpk2sos(pairing='nearest'): poles closest to the
 * unit circle are taken first, each with its nearest zeros, and placed in the LAST section; odd orders get
 * a pole and a zero at the origin (scipy.signal convention).
 */
export function zpk2sos(zeros: Complex[], poles: Complex[], gain: number): number[][] {
  if (!Number.isFinite(gain)) throw new Error(`zpk2sos: gain must be finite (got ${gain})`);
  if (zeros.length === 0 && poles.length === 0) return [[gain, 0, 0, 1, 0, 0]];
  const origin = (n: number): Complex[] => Array.from({ length: Math.max(n, 0) }, (): Complex => [0, 0]);
  let p = [...poles, ...origin(zeros.length - poles.length)];
  let z = [...zeros, ...origin(poles.length - zeros.length)];
  const nSections = Math.floor((p.length + 1) / 2);
  if (p.length % 2 === 1) {
    p.push([0, 0]);
    z.push([0, 0]);
  }
  z = conjugatePairsThenReals(z);
  p = conjugatePairsThenReals(p);
  const sos: number[][] = new Array(nSections);
  for (let si = nSections - 1; si >= 0; si--) {
    const p1 = take(p, worstIndex(p, p.map((_, i) => i)));
    const realPoles = realIndices(p).length;
    if (isReal(p1) && realPoles === 0) {
      const z1 = take(z, nearestIndex(z, p1, "real"));
      sos[si] = section([z1, [0, 0]], [p1, [0, 0]]);
    } else if (p.length + 1 === z.length && !isReal(p1) && realPoles === 1 && realIndices(z).length === 1) {
      const z1 = take(z, nearestIndex(z, p1, "complex"));
      sos[si] = section([z1, cConj(z1)], [p1, cConj(p1)]);
    } else {
      const p2 = isReal(p1) ? take(p, worstIndex(p, realIndices(p))) : cConj(p1);
      if (z.length === 0) {
        sos[si] = [0, 0, 1, ...quadratic([p1, p2])];
        continue;
      }
      const z1 = take(z, nearestIndex(z, p1, "any"));
      if (!isReal(z1)) sos[si] = section([z1, cConj(z1)], [p1, p2]);
      else if (z.length > 0) sos[si] = section([z1, take(z, nearestIndex(z, p1, "real"))], [p1, p2]);
      else sos[si] = section([z1], [p1, p2]);
    }
  }
  sos[0] = sos[0].map((c, i) => (i < 3 ? c * gain : c));
  return sos;
}
