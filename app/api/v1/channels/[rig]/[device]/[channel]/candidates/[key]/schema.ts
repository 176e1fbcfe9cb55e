import { z } from "zod";
import { filterSpecSchema } from "@/lib/dsp";
import { candidateIdSchema, MAX_CANDIDATES_PER_CLIENT } from "@/lib/protocol";

/** The candidate's key on the bench (its id on the stream). */
export const candidateKeySchema = candidateIdSchema;

/** Largest kept spec as JSON, in bytes (the table's check says the same). */
export const MAX_KEPT_SPEC_BYTES = 65_536;

/** PUT body: the candidate's filter spec (any spec the bench designs, at most 64 KiB as JSON) and its colour, one of the bench's six. */
export const saveCandidateSchema = z
  .object({
    spec: filterSpecSchema.refine((spec) => new TextEncoder().encode(JSON.stringify(spec)).length <= MAX_KEPT_SPEC_BYTES, {
      error: `a kept candidate's spec is at most ${MAX_KEPT_SPEC_BYTES / 1024} KiB as JSON`,
    }),
    colorIndex: z.number().int().min(0).max(MAX_CANDIDATES_PER_CLIENT - 1, { error: `colorIndex is 0–${MAX_CANDIDATES_PER_CLIENT - 1}` }),
  })
  .strict();
