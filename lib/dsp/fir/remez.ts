/**
 * Equiripple linear-phase FIR design by the Parks–McClellan algorithm (Remez exchange): the taps
 * minimise the largest weighted error max W(f)·|A(f) − D(f)| over the bands (T. W. Parks and J. H.
 * McClellan, "Chebyshev approximation for nonrecursive digital filters with linear phase", IEEE Trans.
 * Circuit Theory CT-19(2), 1972; J. H. McClellan, T. W. Parks and L. R. Rabiner, "A computer program for
 * designing optimum FIR linear phase digital filters", IEEE Trans. Audio Electroacoust. AU-21(6), 1973).
 * The problem is set up as in that program and in scipy.signal.remez, so the results agree: the same
 * dense grid (16 points per cosine term, band edges included) and the same start; the exchange itself
 * and the final inverse transform are written here.
 */

/** Grid points per cosine term (scipy.signal.remez grid_density default). */
export const REMEZ_GRID_DENSITY = 16;
/** Exchanges tried before the design is refused. */
export const REMEZ_MAX_ITERATIONS = 40;

export interface EquirippleParams {
  /** Number of taps N ≥ 3 (odd: type I; even: type II, zero gain at Nyquist). */
  taps: number;
  /** Band edges in Hz, pairs [low, high] in increasing order, within [0, fs/2]. */
  bandsHz: number[];
  /** Desired gain in each band (dimensionless). */
  desired: number[];
  /** Weight of each band's error (> 0); all 1 when left out. */
  weights?: number[];
  sampleRateHz: number;
}

/** The reduced problem on the dense grid: find A(f) = Σ α_k cos(2πkf), k < terms, minimising max W·|A − D|. */
interface Problem {
  /** Grid frequencies in cycles/sample. */
  freq: number[];
  /** cos(2π·f) of each grid point. */
  x: Float64Array;
  desired: Float64Array;
  weight: Float64Array;
  /** Index of the band each grid point is in. */
  band: Int32Array;
  terms: number;
}

/**
 * Equiripple taps (dimensionless, symmetric). Throws with the reason when the parameters are out of
 * range or when the exchange does not converge in REMEZ_MAX_ITERATIONS steps.
 */
export function equirippleTaps(p: EquirippleParams): number[] {
  const problem = setUp(p);
  const reference = exchange(problem);
  const alpha = cosineCoefficients(problem, reference);
  checkAchieved(problem, alpha, Math.abs(reference.delta), p.taps);
  return p.taps % 2 === 1 ? typeOneTaps(alpha) : typeTwoTaps(alpha);
}

/**
 * Relative excess of the taps' own weighted error over the levelled |δ| tolerated (the cosine transform
 * and rounding); beyond it the exchange's optimum could not be turned into taps.
 */
const ACHIEVED_SLACK = 1e-3;

/**
 * Absolute error, relative to max W·|D|, that no use of the taps can tell from the optimum: below
 * float32's ε (2⁻²³ ≈ 1.2·10⁻⁷), the precision of the f32 layouts. A ripple this small is often not
 * resolved by the exchange (reference points crowd together in a narrow band, e.g. 11 taps with a
 * stopband 0.0104·fs wide: |δ| = 1.05·10⁻⁸, the taps reach 2·10⁻⁸, where scipy.signal.remez's taps reach
 * 2.9·10⁻⁶).
 */
const INDISTINGUISHABLE = 2 ** -23;

/**
 * The taps must reach the ripple the exchange found: W·|A − D| of the cosine series itself, on the grid,
 * within |δ|·(1 + ACHIEVED_SLACK) + INDISTINGUISHABLE·max W·|D|. When transition bands are very wide for
 * the number of taps, the optimum swings to enormous values between the bands and the coefficients
 * cannot be resolved in double precision; that is refused.
 */
function checkAchieved(problem: Problem, alpha: number[], level: number, taps: number): void {
  const allowed = level * (1 + ACHIEVED_SLACK) + INDISTINGUISHABLE * weightedScale(problem);
  for (let i = 0; i < problem.freq.length; i++) {
    const e = problem.weight[i] * Math.abs(chebyshevSum(alpha, problem.x[i]) - problem.desired[i]);
    if (!(e <= allowed)) {
      throw new Error(
        `the Remez exchange did not converge to usable taps: the transition bands are too wide for ${taps} taps (the optimum swings out of range between the bands); narrow the transition bands or use fewer taps`,
      );
    }
  }
}

function setUp(p: EquirippleParams): Problem {
  const { taps, bandsHz, desired, sampleRateHz: fs } = p;
  const weights = p.weights ?? desired.map(() => 1);
  if (!Number.isInteger(taps) || taps < 3) throw new Error(`taps must be an integer of at least 3 (got ${taps})`);
  const bands = desired.length;
  if (bands < 1 || bandsHz.length !== 2 * bands || weights.length !== bands) {
    throw new Error("bandsHz needs two edges per band, and desired and weights one value per band");
  }
  bandsHz.forEach((f, i) => {
    if (!(f >= 0 && f <= fs / 2) || (i > 0 && !(f > bandsHz[i - 1]))) {
      throw new Error(`band edges must increase strictly within 0 … ${fs / 2} Hz (edge ${i} is ${f} Hz)`);
    }
  });
  if (!weights.every((w) => w > 0 && Number.isFinite(w))) throw new Error("every weight must be a finite number > 0");
  const even = taps % 2 === 0;
  const terms = even ? taps / 2 : (taps + 1) / 2;
  const step = 0.5 / (REMEZ_GRID_DENSITY * terms);
  const edges = bandsHz.map((f) => f / fs);
  const freq: number[] = [];
  const bandOf: number[] = [];
  for (let b = 0; b < bands; b++) {
    const top = edges[2 * b + 1];
    let f = edges[2 * b];
    for (;;) {
      freq.push(f);
      bandOf.push(b);
      const next = f + step;
      if (!(next <= top)) break;
      f = next;
    }
    freq[freq.length - 1] = top;
  }
  // Type II has A(1/2) = 0 whatever the taps: the reduced problem below divides by cos(πf), so the grid
  // stops short of Nyquist (as in McClellan, Parks & Rabiner).
  if (even && freq[freq.length - 1] > 0.5 - step) {
    freq.pop();
    bandOf.pop();
  }
  if (freq.length < terms + 1) {
    throw new Error(`the bands hold too few grid points (${freq.length}) for ${taps} taps; widen the bands or use fewer taps`);
  }
  const n = freq.length;
  const problem: Problem = {
    freq,
    x: new Float64Array(n),
    desired: new Float64Array(n),
    weight: new Float64Array(n),
    band: Int32Array.from(bandOf),
    terms,
  };
  freq.forEach((f, i) => {
    // Type II: H(f) = cos(πf)·P(f), so P approximates D/cos(πf) with the weight W·cos(πf).
    const q = even ? Math.cos(Math.PI * f) : 1;
    problem.x[i] = Math.cos(2 * Math.PI * f);
    problem.desired[i] = desired[bandOf[i]] / q;
    problem.weight[i] = weights[bandOf[i]] * q;
  });
  return problem;
}

/** The interpolant through the reference: nodes x_k, values y_k and barycentric weights. */
interface Reference {
  indices: number[];
  nodes: Float64Array;
  values: Float64Array;
  baryWeights: Float64Array;
  /** The weights are the true ones divided by 2^weightScale. */
  weightScale: number;
  /** Signed levelled error δ: E = W·(A − D) = (−1)^k·δ at reference point k. */
  delta: number;
}

/**
 * Π factors as mantissa and binary exponent: the product is mantissa·2^exponent, rescaled by powers of
 * two on the way (exact) so that no partial product over- or underflows.
 */
function scaledProduct(factors: (j: number) => number, count: number): { mantissa: number; exponent: number } {
  let mantissa = 1;
  let exponent = 0;
  for (let j = 0; j < count; j++) {
    mantissa *= factors(j);
    const size = Math.abs(mantissa);
    if (size > 2 ** 500 || (size < 2 ** -500 && size > 0)) {
      const shift = Math.round(Math.log2(size));
      mantissa /= 2 ** shift;
      exponent += shift;
    }
  }
  return { mantissa, exponent };
}

/**
 * Barycentric weights 1/Π_{j≠k} 2(x_k − x_j) (the factor 2, the reciprocal of the capacity of [−1, 1],
 * keeps the products near 1; Berrut & Trefethen, "Barycentric Lagrange interpolation", SIAM Review
 * 46(3), 2004, §4), all divided by 2^scale so that none over- or underflows.
 */
function barycentricWeights(nodes: Float64Array): { weights: Float64Array; scale: number } {
  const n = nodes.length;
  const parts = Array.from(nodes, (xk, k) => scaledProduct((j) => (j === k ? 1 : 2 * (xk - nodes[j])), n));
  const scale = Math.max(...parts.map((p) => -p.exponent - Math.round(Math.log2(Math.abs(p.mantissa)))));
  return { weights: Float64Array.from(parts, (p) => (1 / p.mantissa) * 2 ** (-p.exponent - scale)), scale };
}

/** The levelled reference on the given grid indices (the interpolation conditions of the exchange). */
function levelled(problem: Problem, indices: number[]): Reference {
  const nodes = Float64Array.from(indices, (i) => problem.x[i]);
  const { weights: baryWeights, scale: weightScale } = barycentricWeights(nodes);
  let num = 0;
  let den = 0;
  indices.forEach((i, k) => {
    num += baryWeights[k] * problem.desired[i];
    den += ((k % 2 === 0 ? 1 : -1) * baryWeights[k]) / problem.weight[i];
  });
  // A of degree terms − 1 through terms + 1 points: the highest divided difference Σ w_k·A_k vanishes.
  const delta = -num / den;
  const values = Float64Array.from(indices, (i, k) => problem.desired[i] + ((k % 2 === 0 ? 1 : -1) * delta) / problem.weight[i]);
  return { indices, nodes, values, baryWeights, weightScale, delta };
}

/**
 * A(x) by the barycentric formula (second form), exact at the nodes. Far from every node its
 * denominator Σ w_k/(x − x_k) = 1/ℓ(x) can cancel to nothing; there the first form ℓ(x)·Σ w_k·y_k/(x − x_k),
 * with ℓ(x) = Π 2(x − x_k), is used instead (Higham, "The numerical stability of barycentric Lagrange
 * interpolation", IMA J. Numer. Anal. 24, 2004: the first form is backward stable).
 */
function interpolate(ref: Reference, x: number): number {
  let num = 0;
  let den = 0;
  for (let k = 0; k < ref.nodes.length; k++) {
    const d = x - ref.nodes[k];
    if (d === 0) return ref.values[k];
    const c = ref.baryWeights[k] / d;
    num += c * ref.values[k];
    den += c;
  }
  const second = num / den;
  if (Number.isFinite(second)) return second;
  const l = scaledProduct((k) => 2 * (x - ref.nodes[k]), ref.nodes.length);
  return num * l.mantissa * 2 ** (l.exponent + ref.weightScale);
}

/** Relative slack allowed when comparing an error with |δ| (rounding in the interpolant). */
const LEVEL_SLACK = 1e-12;

/**
 * Rounding level of the weighted error: A − D cancels to |δ|/W, so when |δ| is tiny beside |D| the error
 * at the reference carries an absolute rounding of a few ε·W·|D|; comparisons with |δ| allow for it.
 */
function roundingLevel(problem: Problem): number {
  return 16 * Number.EPSILON * weightedScale(problem);
}

/** max W·|D| over the grid: the size of the weighted desired response. */
function weightedScale(problem: Problem): number {
  let top = 0;
  for (let i = 0; i < problem.weight.length; i++) top = Math.max(top, problem.weight[i] * Math.abs(problem.desired[i]));
  return top;
}

/** An error this far below the weighted desired response is rounding: the design meets D (e.g. equal gains everywhere). */
const EXACT_FIT = 1e-12;

/** W·(A − D) at grid point i, computed once per reference when first asked for. */
type ErrorAt = (i: number) => number;

function lazyError(problem: Problem, ref: Reference): ErrorAt {
  const values = new Float64Array(problem.freq.length);
  const known = new Uint8Array(problem.freq.length);
  return (i) => {
    if (known[i] === 0) {
      values[i] = problem.weight[i] * (interpolate(ref, problem.x[i]) - problem.desired[i]);
      known[i] = 1;
    }
    return values[i];
  };
}

/**
 * The Remez exchange: level the error on the reference, move each reference point to the extremum of
 * the weighted error next to it (climbing, so that only a few grid points are evaluated), and repeat.
 * When no point moves, the error is evaluated on the whole grid: the design is done when the largest
 * error there is |δ| (or at rounding level, when the bands ask for what the taps can give exactly);
 * otherwise each point moves to the largest error between its neighbours. |δ| must grow at every step
 * (de la Vallée Poussin); a step where it shrinks, or running out of steps, refuses.
 */
function exchange(problem: Problem): Reference {
  const n = problem.freq.length;
  const size = problem.terms + 1;
  let indices = Array.from({ length: size - 1 }, (_, j) => Math.floor((j * (n - 1)) / problem.terms));
  indices.push(n - 1);
  let previous = 0;
  const noise = roundingLevel(problem);
  for (let iteration = 1; iteration <= REMEZ_MAX_ITERATIONS; iteration++) {
    const ref = levelled(problem, indices);
    const level = Math.abs(ref.delta);
    if (!Number.isFinite(level)) break;
    if (level < previous * (1 - 1e-9) - noise) {
      throw new Error(
        `the Remez exchange did not converge: the ripple shrank at step ${iteration}; widen the transition bands, use fewer taps or change the weights`,
      );
    }
    previous = level;
    const errorAt = lazyError(problem, ref);
    let next = moveReference(errorAt, indices, ref.delta, n, "climb");
    if (same(next, indices)) {
      let largest = 0;
      for (let i = 0; i < n; i++) largest = Math.max(largest, Math.abs(errorAt(i)));
      if (!Number.isFinite(largest)) break;
      if (largest <= level * (1 + LEVEL_SLACK) + noise || largest <= EXACT_FIT * weightedScale(problem)) return ref;
      next = moveReference(errorAt, indices, ref.delta, n, "widest");
      if (same(next, indices)) return ref;
    }
    indices = next;
  }
  throw new Error(
    `the Remez exchange did not converge in ${REMEZ_MAX_ITERATIONS} steps; widen the transition bands, use fewer taps or change the weights`,
  );
}

const same = (a: number[], b: number[]) => a.every((v, k) => v === b[k]);

/**
 * The next reference: point k (error sign s_k = ±sign δ, alternating) moves within the grid between the
 * new point k − 1 and the old point k + 1 to a larger s_k·E: by climbing from where it is ("climb"), or
 * to the largest s_k·E anywhere there ("widest"); so every point keeps |E| ≥ |δ| and the signs keep
 * alternating. Then, when the error beyond either end has the sign that continues the alternation and
 * exceeds |E| at the other end, the set shifts by one point that way (the exchange of McClellan, Parks &
 * Rabiner, in this form).
 */
function moveReference(errorAt: ErrorAt, old: number[], delta: number, n: number, how: "climb" | "widest"): number[] {
  const size = old.length;
  const sign = (k: number) => (delta < 0 ? -1 : 1) * (k % 2 === 0 ? 1 : -1);
  const next: number[] = [];
  for (let k = 0; k < size; k++) {
    const s = sign(k);
    const from = k === 0 ? 0 : next[k - 1] + 1;
    const to = k === size - 1 ? n - 1 : old[k + 1] - 1;
    let best = Math.max(from, Math.min(old[k], to));
    if (how === "widest") {
      for (let i = from; i <= to; i++) if (s * errorAt(i) > s * errorAt(best)) best = i;
    } else {
      const start = best;
      while (best < to && s * errorAt(best + 1) > s * errorAt(best)) best++;
      if (best === start) while (best > from && s * errorAt(best - 1) > s * errorAt(best)) best--;
    }
    next.push(best);
  }
  const beyond = (from: number, to: number, s: number): number => {
    let best = -1;
    for (let i = from; i <= to; i++) if (s * errorAt(i) > 0 && (best < 0 || s * errorAt(i) > s * errorAt(best))) best = i;
    return best;
  };
  const before = beyond(0, next[0] - 1, -sign(0));
  if (before >= 0 && Math.abs(errorAt(before)) > Math.abs(errorAt(next[size - 1]))) return [before, ...next.slice(0, -1)];
  const after = beyond(next[size - 1] + 1, n - 1, -sign(size - 1));
  if (after >= 0 && Math.abs(errorAt(after)) > Math.abs(errorAt(next[0]))) return [...next.slice(1), after];
  return next;
}

/**
 * α_k of A(f) = Σ α_k·cos(2πkf), k < terms, from A sampled at f_m = m/(2·terms − 1), m < terms (the
 * inverse of that cosine transform; A is a cosine polynomial of degree terms − 1, so this is exact).
 */
function cosineCoefficients(problem: Problem, ref: Reference): number[] {
  const terms = problem.terms;
  const cn = 2 * terms - 1;
  const samples = Array.from({ length: terms }, (_, m) => interpolate(ref, Math.cos((2 * Math.PI * m) / cn)));
  return Array.from({ length: terms }, (_, k) => {
    let sum = samples[0];
    for (let m = 1; m < terms; m++) sum += 2 * samples[m] * Math.cos((2 * Math.PI * ((k * m) % cn)) / cn);
    return (k === 0 ? 1 : 2) * (sum / cn);
  });
}

/** Σ α_k·T_k(x) = Σ α_k·cos(kθ) at x = cos θ, by Clenshaw's recurrence (Press et al., Numerical Recipes, 3rd ed., §5.4.2). */
function chebyshevSum(alpha: number[], x: number): number {
  let b1 = 0;
  let b2 = 0;
  for (let k = alpha.length - 1; k >= 1; k--) {
    const b = alpha[k] + 2 * x * b1 - b2;
    b2 = b1;
    b1 = b;
  }
  return alpha[0] + x * b1 - b2;
}

/** Type I (odd N = 2M + 1): h[M] = α_0, h[M ± k] = α_k/2. */
function typeOneTaps(alpha: number[]): number[] {
  const m = alpha.length - 1;
  const h = new Array<number>(2 * m + 1);
  h[m] = alpha[0];
  for (let k = 1; k <= m; k++) h[m - k] = h[m + k] = alpha[k] / 2;
  return h;
}

/**
 * Type II (even N = 2L): H(f) = cos(πf)·Σ α_k cos(2πkf) written as Σ b_n cos(2πf(n − ½)), n = 1 … L:
 * b_1 = α_0 + α_1/2, b_n = (α_{n−1} + α_n)/2, b_L = α_{L−1}/2; then h[L − n] = h[L − 1 + n] = b_n/2.
 */
function typeTwoTaps(alpha: number[]): number[] {
  const l = alpha.length;
  const at = (k: number) => (k < l ? alpha[k] : 0);
  const h = new Array<number>(2 * l);
  for (let n = 1; n <= l; n++) {
    const b = n === 1 ? at(0) + at(1) / 2 : (at(n - 1) + at(n)) / 2;
    h[l - n] = h[l - 1 + n] = b / 2;
  }
  return h;
}
