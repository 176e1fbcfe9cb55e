import { z } from "zod";
import { ALARM_KINDS, ALARM_SEVERITIES, ALARM_STATES, channelPathSchema, KEY_PATTERN } from "@/lib/protocol";

/** An alarm event's id (the uuid the sidecar gave it). */
export const eventIdParam = z.uuid({ error: "An alarm event id is a UUID." });

const time = z.iso.datetime({ offset: true, error: "Times are ISO 8601 with a zone, e.g. 2026-12-03T10:00:00Z." }).transform((s) => Date.parse(s));

export const listEventsSchema = z
  .object({
    channel: channelPathSchema.optional(),
    rig: z.string().regex(KEY_PATTERN, "rig is a rig key (a-z, 0-9, -)").optional(),
    severity: z.enum(ALARM_SEVERITIES).optional(),
    kind: z.enum(ALARM_KINDS).optional(),
    /** `open`: raised, or a limit alarm cleared and not yet acknowledged. */
    state: z.enum([...ALARM_STATES, "open"]).optional(),
    from: time.optional(),
    to: time.optional(),
    limit: z.coerce.number().int().min(1).max(500).default(200),
  })
  .refine((q) => q.from === undefined || q.to === undefined || q.from < q.to, { error: "from must be before to", path: ["to"] });

export const acknowledgeSchema = z.object({
  comment: z.string().trim().min(1, "Say what was done or seen (a comment is required).").max(500, "Comments are limited to 500 characters."),
});
