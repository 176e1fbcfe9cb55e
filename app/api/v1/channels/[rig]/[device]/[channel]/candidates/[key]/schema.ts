import { z } from "zod";
import { filterSpecSchema } from "@/lib/dsp";
import { candidateIdSchema, MAX_CANDIDATES_PER_CLIENT } from "@/lib/protocol";

/** The candidate's key on the bench (its id on the stream). */
export const candidateKeySchema = candidateIdSchema;

/** PUT body: the candidate's filter spec (any spec the bench designs) and its colour, one of the bench's six. */
export const saveCandidateSchema = z
  .object({
    spec: filterSpecSchema,
    colorIndex: z.number().int().min(0).max(MAX_CANDIDATES_PER_CLIENT - 1, { error: `colorIndex is 0–${MAX_CANDIDATES_PER_CLIENT - 1}` }),
  })
  .strict();
