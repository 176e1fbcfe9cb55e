import { zpk2sos } from "./iir/zpk2sos";
import { finiteRoots } from "./poly-finite";
import type { Complex, DirectForm, FilterDesign } from "./types";

/**
 * Highest denominator order a pasted b/a keeps in direct form. Up to this order a double-precision
 * direct form runs the given coefficients exactly as scipy.signal.lfilter does, and its DC gain is
 * Σb/Σa of the coefficients themselves; root finding and re-expanding into sections would move both
 * (a multiple zero such as a low-pass's (1 + z⁻¹)ᴺ is ill-conditioned, so its roots carry errors of
 * order ε^(1/N)). Higher orders are factored into sections, where direct forms lose accuracy fast.
 */
export const MAX_DIRECT_FORM_ORDER = 8;

/**
 * An FIR design from its taps: N − 1 poles at the origin and gain = the first nonzero tap (scipy.signal
 * tf2zpk convention). Its zeros are left out; designZeros finds them when they are asked for.
 * Throws when every tap is zero.
 */
export function designFromTaps(taps: number[], sampleRateHz: number): FilterDesign {
  const gain = taps.find((t) => t !== 0);
  if (gain === undefined) throw new Error("an FIR needs at least one nonzero tap");
  return { sampleRateHz, taps: [...taps], poles: originRoots(taps.length - 1), gain };
}

/** `count` roots at z = 0. */
export function originRoots(count: number): Complex[] {
  return Array.from({ length: count }, (): Complex => [0, 0]);
}

/**
 * A transfer function H(z) = Σ b_k z⁻ᵏ / Σ a_k z⁻ᵏ (pasted, or an H(s) discretised), exactly as given
 * (an unstable a is kept): an FIR (taps b/a[0]) when a is [1] or 1 followed by zeros; a direct form
 * (designDirectForm) when a's order is at most MAX_DIRECT_FORM_ORDER; otherwise sections (designFromBa).
 */
export function designTransferFunction(b: number[], a: number[], sampleRateHz: number): FilterDesign {
  const { bn, an } = normalise(b, a);
  if (an.slice(1).every((c) => c === 0)) return designFromTaps(bn, sampleRateHz);
  const order = an.length - 1 - [...an].reverse().findIndex((c) => c !== 0);
  return order <= MAX_DIRECT_FORM_ORDER ? designDirectForm(bn, an, sampleRateHz) : designFromBa(bn, an, sampleRateHz);
}

/**
 * A transfer function kept in direct form (`ba`, run as scipy.signal.lfilter runs it), with a[0]
 * normalised to 1 (throws when a[0] = 0). Zeros, poles and gain as in designFromBa.
 */
export function designDirectForm(b: number[], a: number[], sampleRateHz: number): FilterDesign {
  const { bn, an } = normalise(b, a);
  return { sampleRateHz, ba: { b: bn, a: an }, ...directFormZpk(bn, an) };
}

/**
 * A design from a digital transfer function H(z) = Σ b_k z⁻ᵏ / Σ a_k z⁻ᵏ, exactly as given (an
 * unstable a is kept). Normalises a[0] to 1 (throws when a[0] = 0). When a is [1] (or 1 followed by
 * zeros) the result is an FIR with taps b/a[0]. Otherwise the zeros, poles and gain of directFormZpk and
 * sos from zpk2sos.
 */
export function designFromBa(b: number[], a: number[], sampleRateHz: number): FilterDesign {
  const { bn, an } = normalise(b, a);
  if (an.slice(1).every((c) => c === 0)) return designFromTaps(bn, sampleRateHz);
  const { zeros, poles, gain } = directFormZpk(bn, an);
  return { sampleRateHz, sos: sosWithDelay(zeros, poles, gain), zeros, poles, gain };
}

/** How many sections directFormSections gives: ⌈n/2⌉ for order n = max(len b, len a) − 1, at least 1. */
export function directFormSectionCount(ba: DirectForm): number {
  return Math.max(1, Math.ceil((Math.max(ba.b.length, ba.a.length) - 1) / 2));
}

/** A direct form b/a (a[0] = 1) as second-order sections: its roots paired by zpk2sos, a delay kept. */
export function directFormSections(b: number[], a: number[]): number[][] {
  const { zeros, poles, gain } = directFormZpk(b, a);
  return sosWithDelay(zeros, poles, gain);
}

/**
 * Zeros, poles and gain of b/a (a[0] = 1): b and a are padded to equal length L, zeros = roots of b,
 * poles = roots of a (each in positive powers of z, so a leading zero of b is a delay and leaves fewer
 * zeros than poles), gain = the first nonzero b (scipy.signal tf2zpk convention).
 */
function directFormZpk(b: number[], a: number[]): { zeros: Complex[]; poles: Complex[]; gain: number } {
  const length = Math.max(b.length, a.length);
  const pad = (p: number[]) => [...p, ...new Array<number>(length - p.length).fill(0)];
  const gain = b.find((c) => c !== 0);
  if (gain === undefined) throw new Error("b must have a nonzero coefficient");
  return { zeros: finiteRoots(pad(b), "b"), poles: finiteRoots(pad(a), "a"), gain };
}

function normalise(b: number[], a: number[]): { bn: number[]; an: number[] } {
  if (a.length === 0 || a[0] === 0) throw new Error("a[0] must be nonzero (it is normalised to 1)");
  if (b.length === 0 || b.every((c) => c === 0)) throw new Error("b must have a nonzero coefficient");
  return { bn: b.map((c) => c / a[0]), an: a.map((c) => c / a[0]) };
}

/**
 * A design from second-order sections, exactly as given apart from dividing each row by its a0
 * (throws when a row's a0 or whole numerator is zero). Each row contributes the roots of
 * b0·z² + b1·z + b2 and of z² + a1·z + a2; the gain is the product of each row's first nonzero b.
 */
export function designFromSos(sos: number[][], sampleRateHz: number): FilterDesign {
  const rows = sos.map((row, i) => {
    if (row.length !== 6) throw new Error(`sos row ${i} must have 6 numbers [b0, b1, b2, a0, a1, a2]`);
    if (row[3] === 0) throw new Error(`sos row ${i} has a0 = 0; a0 must be nonzero`);
    if (row[0] === 0 && row[1] === 0 && row[2] === 0) throw new Error(`sos row ${i} has an all-zero numerator`);
    return row.map((c) => c / row[3]);
  });
  const zeros = rows.flatMap((r, i) => finiteRoots(r.slice(0, 3), `sos row ${i} numerator`));
  const poles = rows.flatMap((r, i) => finiteRoots(r.slice(3), `sos row ${i} denominator`));
  const gain = rows.reduce((acc, r) => acc * (r.slice(0, 3).find((c) => c !== 0) as number), 1);
  return { sampleRateHz, sos: rows, zeros, poles, gain };
}

/**
 * zpk2sos for a causal H(z) with fewer zeros than poles: the d missing zeros are a d-sample delay
 * z⁻ᵈ. zpk2sos receives the zeros padded with d zeros at the origin (which it turns into trailing
 * numerator zeros) and then d of those trailing zeros are moved to the front of their numerators,
 * multiplying the cascade by z⁻ᵈ.
 */
function sosWithDelay(zeros: Complex[], poles: Complex[], gain: number): number[][] {
  let delay = poles.length - zeros.length;
  const padded = [...zeros, ...originRoots(delay)];
  const sos = zpk2sos(padded, poles, gain);
  for (const row of sos) {
    while (delay > 0 && row[2] === 0 && (row[0] !== 0 || row[1] !== 0)) {
      [row[0], row[1], row[2]] = [0, row[0], row[1]];
      delay--;
    }
  }
  if (delay > 0) throw new Error("sosWithDelay: zpk2sos left too few numerator zeros at the origin");
  return sos;
}
