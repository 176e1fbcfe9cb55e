import { z } from "zod";
import { limitProblems, MAX_MIN_DURATION_MS } from "@/lib/alarms";
import { ALARM_SEVERITIES, ALARM_SIGNALS, channelPathSchema } from "@/lib/protocol";

/** A numeric id from a route segment. */
export const idParam = z.coerce.number().int().positive();

/** Limits are bounded so that every value stays an ordinary number in the channel's unit. */
const MAGNITUDE = 1e12;
const level = (what: string) =>
  z
    .number({ error: `${what} must be a number in the channel's unit` })
    .min(-MAGNITUDE, `${what} must be at least −10¹²`)
    .max(MAGNITUDE, `${what} must be at most 10¹²`)
    .nullable();

const fields = {
  name: z.string().trim().min(1, "Give the rule a name.").max(80, "Names are limited to 80 characters."),
  signal: z.enum(ALARM_SIGNALS),
  high: level("high"),
  low: level("low"),
  deadband: z.number({ error: "deadband must be a number" }).min(0, "The deadband must be 0 or more.").max(MAGNITUDE),
  minDurationMs: z.number().int("minDurationMs must be whole ms").min(0).max(MAX_MIN_DURATION_MS, `At most ${MAX_MIN_DURATION_MS} ms (one hour).`),
  severity: z.enum(ALARM_SEVERITIES),
  enabled: z.boolean(),
};

/** Adds limitProblems' findings as issues on their fields. */
function checkLimits(rule: { high: number | null; low: number | null; deadband: number; minDurationMs: number }, ctx: z.RefinementCtx): void {
  for (const p of limitProblems(rule)) ctx.addIssue({ code: "custom", path: [p.path], message: p.message });
}

export const createRuleSchema = z
  .object({
    channel: channelPathSchema,
    ...fields,
    high: fields.high.default(null),
    low: fields.low.default(null),
    enabled: fields.enabled.default(true),
  })
  .strict()
  .superRefine(checkLimits);

/** Any subset of a rule's fields; the result of applying it is checked again as a whole. */
export const patchRuleSchema = z
  .object(fields)
  .partial()
  .strict()
  .refine((p) => Object.keys(p).length > 0, { error: "Send at least one field to change." });

export const mergedRuleSchema = z.object(fields).superRefine(checkLimits);

export const listRulesSchema = z.object({ channel: channelPathSchema.optional() });
