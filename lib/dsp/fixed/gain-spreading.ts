import { runPart, type SectionPart } from "../analysis/design-form";
import { referenceDb, searchGrid } from "../analysis/gain";

/**
 * Redistribute a cascade's gain with L∞ scaling (Jackson, Digital Filters and Signal Processing,
 * cascade scaling — from memory): block k (one section, or one FIR part) is scaled so the peak
 * magnitude of blocks 0…k together, over [0, fs/2], is 1; the last block takes what is left, so the
 * overall response is unchanged. This keeps every intermediate output within full scale for
 * sinusoids, instead of leaving all the gain in section 0 (scipy.signal zpk2sos puts it there).
 * A section's numerator is scaled, an FIR part's taps; sampleRateHz only sets the frequency grid (Hz).
 */
export function spreadGainForm(form: SectionPart[], sampleRateHz: number): SectionPart[] {
  const blocks: SectionPart[] = form.flatMap((part) => (part.kind === "sos" ? part.sos.map((row): SectionPart => ({ kind: "sos", sos: [row] })) : [part]));
  if (blocks.length === 0) throw new Error("sos must have at least 1 section (got 0)");
  const scaled: SectionPart[] = [];
  let previousPeak = 1;
  blocks.slice(0, -1).forEach((block, k) => {
    const head = blocks.slice(0, k + 1);
    const peak = 10 ** (referenceDb(head, sampleRateHz, searchGrid(head, sampleRateHz)) / 20);
    if (!(peak > 0) || !Number.isFinite(peak)) {
      throw new Error(`cannot scale section ${k}: the peak gain of sections 0…${k} is ${peak}, must be finite and > 0`);
    }
    scaled.push(scaleBlock(block, previousPeak / peak));
    previousPeak = peak;
  });
  scaled.push(scaleBlock(blocks[blocks.length - 1], previousPeak));
  return regroup(form, scaled);
}

/** spreadGainForm for plain SOS rows [b0, b1, b2, 1, a1, a2]. */
export function spreadGain(sos: number[][], sampleRateHz: number): number[][] {
  if (sos.length === 0) throw new Error("sos must have at least 1 section (got 0)");
  const checked = runPart({ sos }, "");
  if (checked.kind !== "sos") return [];
  const [part] = spreadGainForm([checked], sampleRateHz);
  return part.kind === "sos" ? part.sos : [];
}

function scaleBlock(block: SectionPart, f: number): SectionPart {
  if (block.kind === "taps") return { kind: "taps", taps: block.taps.map((t) => t * f) };
  return { kind: "sos", sos: block.sos.map((row) => [row[0] * f, row[1] * f, row[2] * f, row[3], row[4], row[5]]) };
}

/** The scaled blocks gathered back into the parts they came from. */
function regroup(form: SectionPart[], blocks: SectionPart[]): SectionPart[] {
  let next = 0;
  return form.map((part) => {
    if (part.kind === "taps") return blocks[next++];
    const sos = blocks.slice(next, next + part.sos.length).flatMap((b) => (b.kind === "sos" ? b.sos : []));
    next += part.sos.length;
    return { kind: "sos", sos };
  });
}
