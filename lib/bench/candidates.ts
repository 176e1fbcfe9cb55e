import { designFilter, type FilterDesign, type FilterSpec } from "@/lib/dsp";
import { CANDIDATE_COLORS } from "./colors";
import { FIRST_CANDIDATE_SLOT } from "./live-store";

/** A filter being tried on the channel; its id is its trace id on the stream. */
export interface Candidate {
  id: string;
  /** Index into CANDIDATE_COLORS; also fixes the candidate's letter and live slot. */
  colorIndex: number;
  spec: FilterSpec;
  visible: boolean;
}

export const candidateColor = (c: Pick<Candidate, "colorIndex">): string => CANDIDATE_COLORS[c.colorIndex];
export const candidateName = (c: Pick<Candidate, "colorIndex">): string => `Candidate ${String.fromCharCode(65 + c.colorIndex)}`;
export const candidateSlot = (c: Pick<Candidate, "colorIndex">): number => FIRST_CANDIDATE_SLOT + c.colorIndex;

/** Quality factor of a seeded notch (common practice for mains hum: narrow, ≈ 190 ms ring at 50 Hz). */
export const SEED_NOTCH_Q = 30;

/**
 * A spec seeded from a spectral peak at f Hz. "notch": a cookbook notch at f (keeping Q if the spec is
 * already a notch). "cutoff": the spec's own single cutoff moved to f when it has one, else a 4th-order
 * Butterworth low-pass at f.
 */
export function seedSpec(spec: FilterSpec | null, freqHz: number, mode: "notch" | "cutoff", sampleRateHz: number): FilterSpec {
  const f = Number(freqHz.toPrecision(4));
  if (mode === "notch") {
    const q = spec?.kind === "biquad" && spec.shape === "notch" ? spec.q : SEED_NOTCH_Q;
    return { kind: "biquad", shape: "notch", centerHz: f, q, sampleRateHz };
  }
  if (spec && (spec.kind === "iir" || spec.kind === "fir") && typeof spec.cutoffHz === "number") return { ...spec, cutoffHz: f };
  if (spec && spec.kind === "ema") return { ...spec, cutoffHz: f };
  if (spec && spec.kind === "biquad" && spec.shape !== "notch") return { ...spec, centerHz: f };
  return { kind: "iir", family: "butterworth", response: "lowpass", order: 4, cutoffHz: f, sampleRateHz };
}

/** A candidate's design, or why its spec cannot be designed (the validation lines without their heading). */
export type Designed = { design: FilterDesign; error: null } | { design: null; error: string };

export function tryDesign(spec: FilterSpec): Designed {
  try {
    return { design: designFilter(spec), error: null };
  } catch (err) {
    return { design: null, error: err instanceof Error ? err.message.replace(/^invalid filter spec:\n/, "") : String(err) };
  }
}
