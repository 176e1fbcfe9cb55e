import { z } from "zod";
import { channelPathSchema } from "./topics";

/** How loud an alarm is; critical ones are also mailed. */
export const ALARM_SEVERITIES = ["advisory", "warning", "critical"] as const;
export type AlarmSeverity = (typeof ALARM_SEVERITIES)[number];

/** Which trace a rule watches: the production filter's output, or the raw samples. */
export const ALARM_SIGNALS = ["filtered", "raw"] as const;
export type AlarmSignal = (typeof ALARM_SIGNALS)[number];

/** `limit`: the rule's own trace crossed a limit. `masked`: the raw signal crossed a limit the filtered signal did not. */
export const ALARM_KINDS = ["limit", "masked"] as const;
export type AlarmKind = (typeof ALARM_KINDS)[number];

export const ALARM_STATES = ["raised", "cleared"] as const;
export type AlarmState = (typeof ALARM_STATES)[number];

/** Which limit an excursion crossed. */
export const LIMIT_SIDES = ["high", "low"] as const;
export type LimitSide = (typeof LIMIT_SIDES)[number];

const isoTime = z.iso.datetime({ offset: true });

/**
 * One alarm as the API lists it and the WebSocket pushes it (version 1). Times are ISO 8601;
 * `peak` and `limit` are in the channel's `unit`; `revisionId` is the production filter that ran
 * when it was raised (null without one).
 */
export const alarmEventSchema = z
  .object({
    id: z.uuid(),
    ruleId: z.number().int().positive(),
    ruleName: z.string(),
    channel: channelPathSchema,
    unit: z.string(),
    kind: z.enum(ALARM_KINDS),
    severity: z.enum(ALARM_SEVERITIES),
    signal: z.enum(ALARM_SIGNALS),
    side: z.enum(LIMIT_SIDES),
    limit: z.number(),
    state: z.enum(ALARM_STATES),
    raisedAt: isoTime,
    clearedAt: isoTime.nullable(),
    peak: z.number(),
    revisionId: z.number().int().positive().nullable(),
    acknowledgedAt: isoTime.nullable(),
    acknowledgedBy: z.string().nullable(),
    comment: z.string().nullable(),
  })
  .strict();
export type AlarmEventView = z.infer<typeof alarmEventSchema>;

/** Sidecar → every signed-in client: an alarm was raised, cleared or acknowledged. */
export const alarmMessageSchema = z.object({ type: z.literal("alarm"), v: z.literal(1), event: alarmEventSchema }).strict();
export type AlarmMessage = z.infer<typeof alarmMessageSchema>;

/**
 * Whether an alarm still asks for attention: raised, or a limit alarm cleared but not yet
 * acknowledged. A cleared `masked` event is a finding about the filter, kept in the history.
 */
export const isOpenAlarm = (e: Pick<AlarmEventView, "state" | "kind" | "acknowledgedAt">): boolean =>
  e.state === "raised" || (e.kind === "limit" && e.acknowledgedAt === null);
