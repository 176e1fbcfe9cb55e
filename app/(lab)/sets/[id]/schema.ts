import { z } from "zod";
import { filterSpecSchema } from "@/lib/dsp";
import { channelPathSchema } from "@/lib/protocol";
import { TRANSITION_NAMES } from "@/lib/workflow";
import { dbId } from "@/lib/http/fields";

const id = dbId;

export const transitionFormSchema = z.object({
  revisionId: id,
  action: z.enum(TRANSITION_NAMES),
  expectedVersion: id,
  comment: z.string().trim().max(4000).optional(),
});

export const promoteFormSchema = z.object({
  revisionId: id,
  channels: z.array(channelPathSchema).min(1, "Choose at least one channel."),
  confirm: z.literal("yes", { error: "Confirm that you have read the cautions." }),
});

export const rollbackFormSchema = z.object({ channel: channelPathSchema, expectedActiveId: id });

export const retireFormSchema = z.object({ setId: id, expectedVersion: id });

/** The spec arrives as JSON text from the editor's textarea. */
export const reviseFormSchema = z.object({
  setId: id,
  expectedLatestRevision: id,
  notes: z.string().max(4000).optional(),
  spec: z
    .string()
    .transform((text, ctx) => {
      try {
        return JSON.parse(text) as unknown;
      } catch {
        ctx.addIssue({ code: "custom", message: "The spec must be valid JSON." });
        return z.NEVER;
      }
    })
    .pipe(filterSpecSchema),
});
