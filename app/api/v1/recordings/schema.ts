import { z } from "zod";
import { channelPathSchema } from "@/lib/protocol";

const blankToUndefined = (v: unknown) => (v === "" || v === null ? undefined : v);

/** The fields of an upload, from multipart form fields or the query string of a text/csv body. */
export const uploadFieldsSchema = z.object({
  channel: channelPathSchema,
  name: z.preprocess(blankToUndefined, z.string().trim().min(1).max(120, "Names are limited to 120 characters.").optional()),
  notes: z.preprocess(blankToUndefined, z.string().max(4000, "Notes are limited to 4000 characters.").default("")),
  sampleRateHz: z.preprocess(
    blankToUndefined,
    z.coerce.number({ error: "The sample rate must be a number of Hz." }).positive("The sample rate must be above 0 Hz.").max(1e7, "The sample rate must be at most 10 MHz.").optional(),
  ),
});

export type UploadFields = z.infer<typeof uploadFieldsSchema>;

export const listSchema = z.object({ channel: channelPathSchema.optional() });

export const samplesQuerySchema = z.object({ format: z.enum(["f64", "json"]).optional() });
