import type { Complex } from "../types";

/**
 * N-point moving average: taps 1/N each; zeros e^{j2πk/N}, k = 1 … N−1 (exact, from the geometric
 * sum), N − 1 poles at the origin, gain 1/N. H(f) = sin(πfN/fs)/(N·sin(πf/fs))·e^{−jπf(N−1)/fs}
 * (S. W. Smith, The Scientist and Engineer's Guide to Digital Signal Processing, 1997, ch. 15; Oppenheim & Schafer, Discrete-Time Signal Processing, 3rd ed., §5.7).
 */
export function movingAverage(length: number): { taps: number[]; zeros: Complex[]; poles: Complex[]; gain: number } {
  if (!Number.isInteger(length) || length < 1) {
    throw new Error(`moving-average length must be an integer of at least 1 (got ${length})`);
  }
  const zeros: Complex[] = [];
  for (let k = 1; k < length; k++) {
    if (2 * k === length) {
      zeros.push([-1, 0]);
    } else {
      const mirrored = 2 * k > length;
      const angle = (2 * Math.PI * (mirrored ? length - k : k)) / length;
      zeros.push([Math.cos(angle), mirrored ? -Math.sin(angle) : Math.sin(angle)]);
    }
  }
  return {
    taps: new Array<number>(length).fill(1 / length),
    zeros,
    poles: Array.from({ length: length - 1 }, (): Complex => [0, 0]),
    gain: 1 / length,
  };
}
