import { cAbs, cAdd, cDiv, cMul, cScale, cSub } from "./complex";
import type { Complex } from "./types";

const EPS = Number.EPSILON;
/** Roots closer than this (relative to max(1, |r|)) are first looked at together as a possible multiple root. */
const FIRST_LINK = 1e-1;
/** The tightest link tried before a group is left as it is. */
const LAST_LINK = 1e-12;
const NEWTON_STEPS = 8;

/**
 * Taylor coefficients t₀ … t_upto of a real polynomial (descending powers) about c: p(c + w) = Σ t_k wᵏ,
 * by repeated synthetic division by (z − c) (Knuth, The Art of Computer Programming, Vol. 2, 3rd ed., §4.6.4).
 */
function taylorAt(a: number[], c: Complex, upto: number): Complex[] {
  let q: Complex[] = a.map((x): Complex => [x, 0]);
  const t: Complex[] = [];
  for (let k = 0; k <= upto && q.length > 0; k++) {
    const next: Complex[] = [];
    let acc: Complex = [0, 0];
    for (const coeff of q) {
      acc = cAdd(cMul(acc, c), coeff);
      next.push(acc);
    }
    t.push(next.pop() as Complex);
    q = next;
  }
  return t;
}

/** Horner's rounding bound for p at c: ε · Σ |a_k| · |c|^(n−k) (Higham, Accuracy and Stability of Numerical Algorithms, 2nd ed., §5.1). */
function roundingBound(a: number[], c: Complex): number {
  const r = cAbs(c);
  return EPS * a.reduce((acc, x) => acc * r + Math.abs(x), 0);
}

/**
 * The centre of a cluster of m roots: the simple root of p^(m−1) near their mean (an m-fold root of p
 * is a simple root of its (m−1)-th derivative), by Newton's method on p^(m−1)/(m−1)! whose value and
 * slope at c are t_{m−1} and m·t_m.
 */
function clusterCentre(a: number[], members: Complex[]): { centre: Complex; leading: number } {
  const m = members.length;
  let c = cScale(members.reduce((s, r) => cAdd(s, r), [0, 0]), 1 / m);
  let t = taylorAt(a, c, m);
  for (let i = 0; i < NEWTON_STEPS && cAbs(t[m]) > 0; i++) {
    const step = cDiv(t[m - 1], cScale(t[m], m));
    c = cSub(c, step);
    t = taylorAt(a, c, m);
    if (cAbs(step) <= EPS * Math.max(1, cAbs(c))) break;
  }
  return { centre: c, leading: cAbs(t[m]) };
}

/** Groups of roots linked by distances up to `link` (relative to max(1, |r|)), single linkage. */
function linked(roots: Complex[], link: number): Complex[][] {
  const group = roots.map((_, i) => i);
  const find = (i: number): number => (group[i] === i ? i : (group[i] = find(group[i])));
  for (let i = 0; i < roots.length; i++) {
    for (let j = i + 1; j < roots.length; j++) {
      if (cAbs(cSub(roots[i], roots[j])) <= link * Math.max(1, cAbs(roots[i]))) group[find(i)] = find(j);
    }
  }
  const out = new Map<number, Complex[]>();
  roots.forEach((r, i) => out.set(find(i), [...(out.get(find(i)) ?? []), r]));
  return [...out.values()];
}

function refineGroup(a: number[], members: Complex[], link: number): Complex[] {
  const m = members.length;
  if (m < 2) return members;
  const { centre, leading } = clusterCentre(a, members);
  // An m-fold root moved by a perturbation of size η of p lands within (η/|t_m|)^(1/m) of it
  // (Wilkinson, Rounding Errors in Algebraic Processes, 1963, ch. 2; from memory); 4n rounding bounds allowed.
  const radius = ((4 * a.length * roundingBound(a, centre)) / leading) ** (1 / m);
  if (Number.isFinite(radius) && members.every((r) => cAbs(cSub(r, centre)) <= radius)) {
    const shift = cSub(centre, cScale(members.reduce((s, r) => cAdd(s, r), [0, 0]), 1 / m));
    return members.map((r) => cAdd(r, shift));
  }
  if (link <= LAST_LINK) return members;
  return linked(members, link / 10).flatMap((g) => refineGroup(a, g, link / 10));
}

/**
 * Roots from a simultaneous iteration stop anywhere inside the rounding disc of a multiple root, so
 * the members of a computed m-fold root scatter by about ε^(1/m) with a mean that is off too; the
 * first-order errors of |H| then no longer cancel. Every group of roots within the rounding radius of
 * one point is moved, as a whole, so that its mean is that point: the simple root of p^(m−1) there
 * (the mean of a tight cluster is well determined where its members are not). The spread is kept, so
 * distinct close roots stay distinct; groups wider than the radius are left as they are.
 * `a` is the polynomial in descending powers, `roots` its roots with multiplicity.
 */
export function refineMultipleRoots(a: number[], roots: Complex[]): Complex[] {
  return linked(roots, FIRST_LINK).flatMap((g) => refineGroup(a, g, FIRST_LINK));
}
