import { characteristicPolynomial, expm, type Matrix } from "../linalg";

/**
 * Frequency-scaled controllable canonical form of a monic polynomial p(s) = sⁿ + c₁sⁿ⁻¹ + … + cₙ:
 * S·A·S⁻¹ with S = diag(1, ω, …, ωⁿ⁻¹), i.e. first row −c_j/ω^{j−1}, subdiagonal ω, where
 * ω = max_j |c_j|^{1/j} bounds the root magnitudes within a factor 2 (Fujiwara 1916). The
 * similarity keeps the eigenvalues (the roots of p) and the transfer function, and keeps the matrix
 * entries within ω·[−1, 1] however widely the coefficients spread, so that expm needs no excess
 * squarings (scaling to balance: Parlett & Reinsch 1969).
 */
export function scaledCompanion(monic: number[]): { matrix: Matrix; omega: number } {
  const n = monic.length - 1;
  const omega = Math.max(...monic.slice(1).map((c, j) => Math.abs(c) ** (1 / (j + 1))), 0) || 1;
  const matrix: Matrix = Array.from({ length: n }, () => new Array<number>(n).fill(0));
  for (let j = 0; j < n; j++) matrix[0][j] = -monic[j + 1] / omega ** j;
  for (let i = 1; i < n; i++) matrix[i][i - 1] = omega;
  return { matrix, omega };
}

/**
 * The monic polynomial whose roots are e^{rT} for the roots r of the monic p(s), T in s:
 * det(zI − e^{A·T}) for a companion matrix A of p, so no root of p is ever computed (repeated roots
 * lose no accuracy). The eigenvalues of e^{AT} are e^{λT} (spectral mapping theorem).
 */
export function exponentialRootPolynomial(monic: number[], periodS: number): number[] {
  const { matrix } = scaledCompanion(monic);
  return characteristicPolynomial(expm(matrix.map((row) => row.map((v) => v * periodS))));
}
