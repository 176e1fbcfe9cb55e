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

/** A fresh candidate id, "c" and 18 random hex digits: kept candidates outlive a reload, so a counter would repeat. */
export function newCandidateId(): string {
  return `c${[...crypto.getRandomValues(new Uint8Array(9))].map((b) => b.toString(16).padStart(2, "0")).join("")}`;
}

export const candidateColor = (c: Pick<Candidate, "colorIndex">): string => CANDIDATE_COLORS[c.colorIndex];
export const candidateName = (c: Pick<Candidate, "colorIndex">): string => `Candidate ${String.fromCharCode(65 + c.colorIndex)}`;
export const candidateSlot = (c: Pick<Candidate, "colorIndex">): number => FIRST_CANDIDATE_SLOT + c.colorIndex;

/** A candidate's design, or why its spec cannot be designed (the validation lines without their heading). */
export type Designed = { design: FilterDesign; error: null } | { design: null; error: string };

export function tryDesign(spec: FilterSpec): Designed {
  try {
    return { design: designFilter(spec), error: null };
  } catch (err) {
    return { design: null, error: err instanceof Error ? err.message.replace(/^invalid filter spec:\n/, "") : String(err) };
  }
}
