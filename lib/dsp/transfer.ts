import { firZpk } from "./fir/zpk";
import { zpk2sos } from "./iir/zpk2sos";
import { finiteRoots } from "./poly-finite";
import type { Complex, FilterDesign } from "./types";

/** An FIR design from its taps (zeros, poles and gain as in firZpk). */
export function designFromTaps(taps: number[], sampleRateHz: number): FilterDesign {
  return { sampleRateHz, taps: [...taps], ...firZpk(taps) };
}

/**
 * A design from a digital transfer function H(z) = Σ b_k z⁻ᵏ / Σ a_k z⁻ᵏ, exactly as given (an
 * unstable a is kept). Normalises a[0] to 1 (throws when a[0] = 0). When a is [1] (or 1 followed by
 * zeros) the result is an FIR with taps b/a[0]. Otherwise b and a are padded to equal length L,
 * zeros = roots of b, poles = roots of a (each in positive powers of z, so a leading zero of b is a
 * delay and leaves fewer zeros than poles), gain = first nonzero b, and sos from zpk2sos.
 */
export function designFromBa(b: number[], a: number[], sampleRateHz: number): FilterDesign {
  if (a.length === 0 || a[0] === 0) throw new Error("a[0] must be nonzero (it is normalised to 1)");
  if (b.length === 0 || b.every((c) => c === 0)) throw new Error("b must have a nonzero coefficient");
  const bn = b.map((c) => c / a[0]);
  const an = a.map((c) => c / a[0]);
  if (an.slice(1).every((c) => c === 0)) return designFromTaps(bn, sampleRateHz);
  const length = Math.max(bn.length, an.length);
  const pad = (p: number[]) => [...p, ...new Array<number>(length - p.length).fill(0)];
  const zeros = finiteRoots(pad(bn), "b");
  const poles = finiteRoots(pad(an), "a");
  const gain = bn.find((c) => c !== 0) as number;
  return { sampleRateHz, sos: sosWithDelay(zeros, poles, gain), zeros, poles, gain };
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
  const padded = [...zeros, ...Array.from({ length: delay }, (): Complex => [0, 0])];
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
