import { z } from "zod";
import { filterSpecSchema } from "@/lib/dsp";
import { alarmMessageSchema } from "./alarms";
import { FAULT_KINDS } from "./faults";
import type { FrameMessage } from "./frames";
import { channelPathSchema } from "./topics";

/** WebSocket protocol version; the server says it in its hello message. 2: frames are binary; 3: a binary message carries one or more frames (lib/protocol/frames.ts). */
export const WS_PROTOCOL_VERSION = 3;

export const MAX_CANDIDATES_PER_CLIENT = 6;
export const MAX_WINDOW_SECONDS = 60;

/** A candidate id chosen by the browser, unique per connection and channel. */
export const candidateIdSchema = z.string().regex(/^[A-Za-z0-9_-]{1,32}$/, { error: "id must be 1–32 of A-Z a-z 0-9 _ -" });

export const clientMessageSchema = z.discriminatedUnion("type", [
  z.object({ type: z.literal("subscribe"), channel: channelPathSchema }).strict(),
  z.object({ type: z.literal("unsubscribe"), channel: channelPathSchema }).strict(),
  z.object({ type: z.literal("candidate.add"), channel: channelPathSchema, id: candidateIdSchema, spec: filterSpecSchema }).strict(),
  z.object({ type: z.literal("candidate.remove"), channel: channelPathSchema, id: candidateIdSchema }).strict(),
  z
    .object({
      type: z.literal("window"),
      channel: channelPathSchema,
      seconds: z.number().min(1).max(MAX_WINDOW_SECONDS),
      maxPoints: z.number().int().min(16).max(1_000_000),
    })
    .strict(),
  /**
   * The frequency in Hz at which this connection's live metrics judge attenuation (the noise line),
   * 0 < freqHz < fs/2 of the channel (the sidecar checks the upper bound); null: the strongest peak
   * of the raw spectrum.
   */
  z.object({ type: z.literal("noise-line"), channel: channelPathSchema, freqHz: z.number().positive().finite().nullable() }).strict(),
]);
export type ClientMessage = z.infer<typeof clientMessageSchema>;

/** The closed set of error codes a WebSocket client may receive. */
export const WS_ERROR_CODES = [
  "bad_message",
  "forbidden",
  "unknown_channel",
  "not_subscribed",
  "too_many_candidates",
  "duplicate_candidate",
  "unknown_candidate",
  "bad_spec",
  "rate_limited",
  "busy",
  "internal",
] as const;
export type WsErrorCode = (typeof WS_ERROR_CODES)[number];

const number = z.number();

/**
 * A channel's production filter changed: a deployment was acknowledged by its device (a promotion, a
 * rollback, or a return to pass-through). Sent as JSON to every open connection; clients reload what
 * they show of that channel's production filter. `revisionId` is the revision now active, null for
 * pass-through.
 */
export const productionChangedSchema = z
  .object({ type: z.literal("production-changed"), channel: channelPathSchema, revisionId: z.number().int().positive().nullable() })
  .strict();
export type ProductionChanged = z.infer<typeof productionChangedSchema>;

const faultCounts = z.partialRecord(z.enum(FAULT_KINDS), z.number().int());

/** The server's JSON control messages (WebSocket text messages); frames travel as binary messages. */
export const serverMessageSchema = z.discriminatedUnion("type", [
  z
    .object({
      type: z.literal("hello"),
      protocol: z.literal(WS_PROTOCOL_VERSION),
      role: z.enum(["operator", "engineer", "lead", "admin"]),
      channels: z.array(z.object({ path: channelPathSchema, sampleRateHz: number })),
    })
    .strict(),
  z.object({ type: z.literal("error"), code: z.enum(WS_ERROR_CODES), message: z.string() }).strict(),
  /** The channel is now filtered by another sidecar: ask the web app where (GET /api/v1/live/owner) and connect there. */
  z.object({ type: z.literal("moved"), channel: channelPathSchema }).strict(),
  z
    .object({
      type: z.literal("status"),
      mqtt: z.enum(["connected", "reconnecting", "closed"]),
      droppedFrames: z.number().int(),
      faults: z.record(z.string(), faultCounts),
    })
    .strict(),
  z
    .object({
      type: z.literal("metrics"),
      channel: channelPathSchema,
      candidates: z.record(
        z.string(),
        z.object({
          removedRms: number.nullable(),
          lagMs: number.nullable(),
          measuredAttenuationDb: number.nullable(),
          predictedAttenuationDb: number.nullable(),
          noiseLineHz: number.nullable(),
        }),
      ),
    })
    .strict(),
  alarmMessageSchema,
  productionChangedSchema,
]);
export type ControlMessage = z.infer<typeof serverMessageSchema>;
/** Everything a client receives: JSON control messages and decoded binary frames. */
export type ServerMessage = ControlMessage | FrameMessage;

/** A control message from a WebSocket text message, or null when it is not JSON or not a message of this protocol. */
export function parseServerMessage(text: string): ControlMessage | null {
  let json: unknown;
  try {
    json = JSON.parse(text);
  } catch {
    return null; // not JSON: not ours
  }
  const parsed = serverMessageSchema.safeParse(json);
  return parsed.success ? parsed.data : null;
}
export type CandidateMetrics = Extract<ControlMessage, { type: "metrics" }>["candidates"][string];

/** The sidecar's WebSocket path. */
export const WS_PATH = "/ws";

/** Close code when an open connection's session ends (signed out, account disabled, password changed); do not retry. */
export const SESSION_ENDED = 4401;

/** Close code for a connection that keeps sending far past its message rate. */
export const TOO_MANY_MESSAGES = 4429;
