/** Small dense real matrices as arrays of rows (common practice); just what discretisation needs. */
export type Matrix = number[][];

export function identity(n: number): Matrix {
  return Array.from({ length: n }, (_, i) => Array.from({ length: n }, (_, j) => (i === j ? 1 : 0)));
}

export function matMul(a: Matrix, b: Matrix): Matrix {
  const inner = b.length;
  const cols = inner === 0 ? 0 : b[0].length;
  return a.map((row) => {
    const out = new Array<number>(cols).fill(0);
    for (let k = 0; k < inner; k++) {
      const r = row[k];
      if (r === 0) continue;
      for (let j = 0; j < cols; j++) out[j] += r * b[k][j];
    }
    return out;
  });
}

/** Linear combination Σ kᵢ·Mᵢ of same-sized matrices. */
export function matCombine(terms: Array<[number, Matrix]>): Matrix {
  const [, first] = terms[0];
  return first.map((row, i) =>
    row.map((_, j) => terms.reduce((acc, [k, m]) => acc + k * m[i][j], 0)),
  );
}

/** Maximum absolute column sum ‖M‖₁. */
export function norm1(m: Matrix): number {
  if (m.length === 0) return 0;
  let best = 0;
  for (let j = 0; j < m[0].length; j++) {
    let sum = 0;
    for (const row of m) sum += Math.abs(row[j]);
    best = Math.max(best, sum);
  }
  return best;
}

/**
 * Solves A·X = B by Gaussian elimination with partial pivoting (Golub & Van Loan, Matrix
 * Computations §3.4). Throws when A is singular to working precision.
 */
export function solve(a: Matrix, b: Matrix): Matrix {
  const n = a.length;
  const lu = a.map((row) => row.slice());
  const x = b.map((row) => row.slice());
  const scale = norm1(a) || 1;
  for (let col = 0; col < n; col++) {
    let pivot = col;
    for (let r = col + 1; r < n; r++) {
      if (Math.abs(lu[r][col]) > Math.abs(lu[pivot][col])) pivot = r;
    }
    if (Math.abs(lu[pivot][col]) <= Number.EPSILON * scale) {
      throw new Error("solve: matrix is singular to working precision");
    }
    [lu[col], lu[pivot]] = [lu[pivot], lu[col]];
    [x[col], x[pivot]] = [x[pivot], x[col]];
    for (let r = col + 1; r < n; r++) {
      const f = lu[r][col] / lu[col][col];
      if (f === 0) continue;
      for (let c = col; c < n; c++) lu[r][c] -= f * lu[col][c];
      for (let c = 0; c < x[r].length; c++) x[r][c] -= f * x[col][c];
    }
  }
  for (let r = n - 1; r >= 0; r--) {
    for (let c = 0; c < x[r].length; c++) {
      let s = x[r][c];
      for (let k = r + 1; k < n; k++) s -= lu[r][k] * x[k][c];
      x[r][c] = s / lu[r][r];
    }
  }
  return x;
}

/** Coefficients of the [13/13] Padé approximant of eˣ (Higham 2005, SIAM J. Matrix Anal. Appl. 26(4), eq. 2.2). */
const PADE13 = [
  64764752532480000, 32382376266240000, 7771770303897600, 1187353796428800, 129060195264000,
  10559470521600, 670442572800, 33522128640, 1323241920, 40840800, 960960, 16380, 182, 1,
];

/** ‖A‖₁ bound below which the degree-13 Padé approximant is accurate to double precision (Higham 2005, Table 2.3). */
const THETA13 = 5.371920351148152;

/**
 * Matrix exponential e^A by scaling and squaring with the [13/13] Padé approximant
 * (Higham 2005, "The scaling and squaring method for the matrix exponential revisited", Alg. 2.3,
 * always using degree 13; Moler & Van Loan 2003, "Nineteen dubious ways…", method 3).
 */
export function expm(a: Matrix): Matrix {
  const n = a.length;
  if (n === 0) return [];
  const norm = norm1(a);
  if (!Number.isFinite(norm)) throw new Error("expm: matrix entries must be finite");
  const s = norm > THETA13 ? Math.ceil(Math.log2(norm / THETA13)) : 0;
  const scaled = matCombine([[2 ** -s, a]]);
  const c = PADE13;
  const id = identity(n);
  const a2 = matMul(scaled, scaled);
  const a4 = matMul(a2, a2);
  const a6 = matMul(a4, a2);
  const uInner = matCombine([[c[13], a6], [c[11], a4], [c[9], a2]]);
  const u = matMul(
    scaled,
    matCombine([[1, matMul(a6, uInner)], [c[7], a6], [c[5], a4], [c[3], a2], [c[1], id]]),
  );
  const vInner = matCombine([[c[12], a6], [c[10], a4], [c[8], a2]]);
  const v = matCombine([[1, matMul(a6, vInner)], [c[6], a6], [c[4], a4], [c[2], a2], [c[0], id]]);
  let r = solve(matCombine([[1, v], [-1, u]]), matCombine([[1, v], [1, u]]));
  for (let i = 0; i < s; i++) r = matMul(r, r);
  return r;
}

/**
 * Characteristic polynomial det(zI − M) in descending powers of z (monic), without eigenvalues:
 * Householder reduction to upper Hessenberg form H (Golub & Van Loan §7.4.2), then the recurrence
 * p_k = (z − h_kk)·p_{k−1} − Σ_{i<k} h_ik·(h_{i+1,i} ⋯ h_{k,k−1})·p_{i−1} (Wilkinson, The Algebraic
 * Eigenvalue Problem §6.57). Repeated eigenvalues cost no accuracy, unlike Π(z − λ) from computed λ.
 */
export function characteristicPolynomial(m: Matrix): number[] {
  const n = m.length;
  const h = m.map((row) => row.slice());
  for (let k = 0; k < n - 2; k++) {
    const x = h.slice(k + 1).map((row) => row[k]);
    const alpha = -Math.sign(x[0] || 1) * Math.hypot(...x);
    const v = x.slice();
    v[0] -= alpha;
    const vNorm2 = v.reduce((acc, vi) => acc + vi * vi, 0);
    if (vNorm2 === 0) continue;
    for (let j = 0; j < n; j++) {
      const dot = v.reduce((acc, vi, i) => acc + vi * h[k + 1 + i][j], 0);
      const f = (2 * dot) / vNorm2;
      v.forEach((vi, i) => (h[k + 1 + i][j] -= f * vi));
    }
    for (let i = 0; i < n; i++) {
      const dot = v.reduce((acc, vj, j) => acc + vj * h[i][k + 1 + j], 0);
      const f = (2 * dot) / vNorm2;
      v.forEach((vj, j) => (h[i][k + 1 + j] -= f * vj));
    }
  }
  const p: number[][] = [[1]];
  for (let k = 1; k <= n; k++) {
    const next = [...p[k - 1], 0];
    p[k - 1].forEach((c, i) => (next[i + 1] -= h[k - 1][k - 1] * c));
    let sub = 1;
    for (let i = k - 1; i >= 1; i--) {
      sub *= h[i][i - 1];
      const factor = h[i - 1][k - 1] * sub;
      const lower = p[i - 1];
      const offset = next.length - lower.length;
      lower.forEach((c, j) => (next[offset + j] -= factor * c));
    }
    p.push(next);
  }
  return p[n];
}
