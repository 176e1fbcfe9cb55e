import type { Complex } from "./types";

/** Complex arithmetic on [re, im] pairs (common practice; unitless). */

export function cAdd(a: Complex, b: Complex): Complex {
  return [a[0] + b[0], a[1] + b[1]];
}

export function cSub(a: Complex, b: Complex): Complex {
  return [a[0] - b[0], a[1] - b[1]];
}

export function cMul(a: Complex, b: Complex): Complex {
  return [a[0] * b[0] - a[1] * b[1], a[0] * b[1] + a[1] * b[0]];
}

/** a / b by Smith's algorithm (Smith 1962, CACM 5(8):435), which avoids overflow in |b|². */
export function cDiv(a: Complex, b: Complex): Complex {
  const [ar, ai] = a;
  const [br, bi] = b;
  if (Math.abs(br) >= Math.abs(bi)) {
    if (br === 0) return [ar / 0, ai / 0];
    const r = bi / br;
    const d = br + bi * r;
    return [(ar + ai * r) / d, (ai - ar * r) / d];
  }
  const r = br / bi;
  const d = br * r + bi;
  return [(ar * r + ai) / d, (ai * r - ar) / d];
}

export function cScale(a: Complex, k: number): Complex {
  return [a[0] * k, a[1] * k];
}

export function cNeg(a: Complex): Complex {
  return [-a[0], -a[1]];
}

export function cConj(a: Complex): Complex {
  return [a[0], -a[1]];
}

/** |a| via Math.hypot (no overflow for large parts). */
export function cAbs(a: Complex): number {
  return Math.hypot(a[0], a[1]);
}

/** Principal argument in (−π, π] rad. */
export function cArg(a: Complex): number {
  return Math.atan2(a[1], a[0]);
}

/** e^a = e^re · (cos im + j sin im). */
export function cExp(a: Complex): Complex {
  const m = Math.exp(a[0]);
  return [m * Math.cos(a[1]), m * Math.sin(a[1])];
}

/** Principal square root (branch cut on the negative real axis, Re ≥ 0), computed without cancellation. */
export function cSqrt(a: Complex): Complex {
  const [x, y] = a;
  if (x === 0 && y === 0) return [0, y];
  const t = Math.sqrt((Math.abs(x) + Math.hypot(x, y)) / 2);
  if (x >= 0) return [t, y / (2 * t)];
  return [Math.abs(y) / (2 * t), y < 0 || Object.is(y, -0) ? -t : t];
}
