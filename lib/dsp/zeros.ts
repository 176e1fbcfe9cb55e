import { designStages } from "./chain";
import { zpk2sos } from "./iir/zpk2sos";
import { finiteRoots } from "./poly-finite";
import { directFormSections } from "./transfer";
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

/** How many second-order sections designSections gives, known without finding any root. */
export function sectionCount(design: FilterDesign): number {
  return designStages(design).reduce((n, stage) => {
    if (stage.sos) return n + stage.sos.length;
    const length = stage.taps?.length ?? Math.max(stage.ba?.b.length ?? 0, stage.ba?.a.length ?? 0);
    return n + Math.max(1, Math.ceil((length - 1) / 2));
  }, 0);
}

/**
 * A design as second-order sections in running order, the form a device runs: sections as they are;
 * FIR taps factored from their zeros (poles at the origin) and direct forms from their roots, paired
 * by zpk2sos as scipy does; a chain's stages one after the other.
 */
export function designSections(design: FilterDesign): number[][] {
  return designStages(design).flatMap((stage) => {
    if (stage.sos) return stage.sos;
    if (stage.ba) return directFormSections(stage.ba.b, stage.ba.a);
    return zpk2sos(designZeros(stage), stage.poles, stage.gain);
  });
}
