import { finiteRoots } from "./poly-finite";
import type { Complex, FilterDesign } from "./types";

/**
 * The zeros of any design (z-plane, positive powers of z, with multiplicity): `design.zeros` when the
 * design carries them; otherwise found now: the roots of the taps of an FIR, of each section's
 * numerator, of a direct form's b padded to the length of a, and a chain's stages' together. Root
 * finding a 1023-tap FIR takes seconds, so callers in a browser run this off the main thread.
 */
export function designZeros(design: FilterDesign): Complex[] {
  if (design.zeros) return design.zeros;
  if (design.stages) return design.stages.flatMap(designZeros);
  if (design.taps) return finiteRoots(design.taps, "taps");
  if (design.ba) {
    const { b, a } = design.ba;
    return finiteRoots([...b, ...new Array<number>(Math.max(0, a.length - b.length)).fill(0)], "b");
  }
  return (design.sos ?? []).flatMap((row, i) => finiteRoots(row.slice(0, 3), `sos row ${i} numerator`));
}
