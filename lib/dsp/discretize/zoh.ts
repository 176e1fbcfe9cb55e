import { characteristicPolynomial, expm, matMul, type Matrix } from "../linalg";
import { scaledCompanion } from "./companion";

/**
 * Zero-order-hold (step-invariant) equivalent of H(s) = num(s)/den(s) (equal length n + 1,
 * den[0] ≠ 0) for sample period T in s; returns b, a as coefficients of z⁰ … z⁻ⁿ with a[0] = 1.
 * Method (Franklin, Powell & Workman, Digital Control of Dynamic Systems, 3rd ed., §6.3.2; the
 * scipy.signal.cont2discrete 'zoh' realisation up to a diagonal state scaling): controllable
 * canonical state space (scipy tf2ss layout) scaled by scaledCompanion; Φ and Γ from one matrix
 * exponential of [[A·T, B·T], [0, 0]] (Van Loan 1978, IEEE TAC 23(3)); denominator det(zI − Φ),
 * whose roots are e^{pT} for the poles p of H(s); numerator bⱼ = Σᵢ aᵢ·h_{j−i} from the Markov
 * parameters h₀ = D, h_k = C·Φ^{k−1}·Γ.
 */
export function zohDiscretize(num: number[], den: number[], periodS: number): { b: number[]; a: number[] } {
  const n = den.length - 1;
  const monicNum = num.map((c) => c / den[0]);
  const monicDen = den.map((c) => c / den[0]);
  const d = monicNum[0];
  if (n === 0) return { b: [d], a: [1] };

  const { matrix: companion, omega } = scaledCompanion(monicDen);
  const augmented: Matrix = Array.from({ length: n + 1 }, (_, i) =>
    i < n ? [...companion[i].map((v) => v * periodS), i === 0 ? periodS : 0] : new Array<number>(n + 1).fill(0),
  );
  const e = expm(augmented);
  const phi = e.slice(0, n).map((row) => row.slice(0, n));
  let phiPowerGamma: Matrix = e.slice(0, n).map((row) => [row[n]]);
  const c = Array.from({ length: n }, (_, j) => (monicNum[j + 1] - d * monicDen[j + 1]) / omega ** j);

  const markov = [d];
  for (let k = 1; k <= n; k++) {
    markov.push(c.reduce((acc, cj, j) => acc + cj * phiPowerGamma[j][0], 0));
    phiPowerGamma = matMul(phi, phiPowerGamma);
  }
  const a = characteristicPolynomial(phi);
  const b = a.map((_, j) => {
    let sum = 0;
    for (let i = 0; i <= j; i++) sum += a[i] * markov[j - i];
    return sum;
  });
  return { b, a };
}
