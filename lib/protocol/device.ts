import { z } from "zod";
import { KEY_PATTERN } from "./topics";

/** Retained on `<rig>/<device>/status`; the broker publishes the offline form as the device's last will. */
export const deviceStatusSchema = z.object({ state: z.enum(["online", "offline"]) }).strict();
export type DeviceStatus = z.infer<typeof deviceStatusSchema>;

export const COEFFICIENT_FORMATS = ["f32", "q15", "q31"] as const;
export type ConfigFormat = (typeof COEFFICIENT_FORMATS)[number];

const key = z.string().regex(KEY_PATTERN);
const revisionId = z.string().min(1).max(64);
const configId = z.string().min(1).max(64);
const checksum = z.string().regex(/^[0-9a-f]{64}$/, { error: "checksum must be 64 lowercase hex digits (SHA-256)" });

/** One f32 section as an SOS row [b0, b1, b2, a0, a1, a2] with a0 = 1. */
export const floatSectionSchema = z.array(z.number()).length(6).refine((row) => row[3] === 1, { error: "a0 must be 1" });

/** Words in Qn (n = 15 or 31) sharing one post-shift: coefficient = word · 2^(shift − n). */
const fixedGroup = (bits: 15 | 31, length: z.ZodArray<z.ZodNumber>) =>
  z.object({ words: length, shift: z.number().int().min(0).max(bits) }).strict();
const word = (bits: 15 | 31) => z.number().int().min(-(2 ** bits)).max(2 ** bits - 1);

/** One fixed-point section: words [b0, b1, b2, a1, a2] and the section's post-shift. */
export const fixedSectionSchema = (bits: 15 | 31) => fixedGroup(bits, z.array(word(bits)).length(5));

/** Most sections one channel runs, over all its stages. */
export const MAX_CONFIG_SECTIONS = 64;
/** Most FIR taps one channel runs, over all its stages. */
export const MAX_CONFIG_TAPS = 1024;
/** Most stages in one channel's chain (a chain spec's limit). */
export const MAX_CONFIG_STAGES = 8;

/**
 * The stages of one format: `sections` (second-order sections, in order) or `fir` (taps h[0]…h[N−1]).
 * f32 sections are SOS rows, f32 taps a list of numbers; in Q15/Q31 every section and every tap list
 * is `{words, shift}`.
 */
function stageSchema<S extends z.ZodType, T extends z.ZodType>(section: S, taps: T) {
  return z.discriminatedUnion("kind", [
    z.object({ kind: z.literal("sections"), sections: z.array(section).min(1).max(MAX_CONFIG_SECTIONS) }).strict(),
    z.object({ kind: z.literal("fir"), taps }).strict(),
  ]);
}

const floatTaps = z.array(z.number()).min(1).max(MAX_CONFIG_TAPS);
const fixedTaps = (bits: 15 | 31) => fixedGroup(bits, z.array(word(bits)).min(1).max(MAX_CONFIG_TAPS));

export const floatStageSchema = stageSchema(floatSectionSchema, floatTaps);
export const q15StageSchema = stageSchema(fixedSectionSchema(15), fixedTaps(15));
export const q31StageSchema = stageSchema(fixedSectionSchema(31), fixedTaps(31));
export type FloatStage = z.infer<typeof floatStageSchema>;
export type FixedStage = z.infer<typeof q15StageSchema>;

/** Sections and taps a list of stages holds altogether (what a channel's capacity is checked against). */
export function stageCounts(stages: ReadonlyArray<FloatStage | FixedStage>): { sections: number; taps: number } {
  let sections = 0;
  let taps = 0;
  for (const stage of stages) {
    if (stage.kind === "sections") sections += stage.sections.length;
    else taps += Array.isArray(stage.taps) ? stage.taps.length : stage.taps.words.length;
  }
  return { sections, taps };
}

const stageList = <S extends z.ZodType<FloatStage | FixedStage>>(stage: S) =>
  z
    .array(stage)
    .max(MAX_CONFIG_STAGES)
    .superRefine((stages, ctx) => {
      const { sections, taps } = stageCounts(stages);
      if (sections > MAX_CONFIG_SECTIONS) ctx.addIssue({ code: "custom", message: `a channel runs at most ${MAX_CONFIG_SECTIONS} sections (got ${sections})` });
      if (taps > MAX_CONFIG_TAPS) ctx.addIssue({ code: "custom", message: `a channel runs at most ${MAX_CONFIG_TAPS} FIR taps (got ${taps})` });
    });

const channelConfigBase = {
  revisionId,
  sampleRateHz: z.number().positive(),
};

/**
 * One channel's filter inside a device configuration (v3): the revision, the coefficient format, the
 * sample rate it was designed for and its chain, an ordered list of stages run one after the other;
 * an empty `stages` list is a unit filter.
 */
export const channelConfigSchema = z.discriminatedUnion("format", [
  z.object({ ...channelConfigBase, format: z.literal("f32"), stages: stageList(floatStageSchema) }).strict(),
  z.object({ ...channelConfigBase, format: z.literal("q15"), stages: stageList(q15StageSchema) }).strict(),
  z.object({ ...channelConfigBase, format: z.literal("q31"), stages: stageList(q31StageSchema) }).strict(),
]);
export type ChannelConfig = z.infer<typeof channelConfigSchema>;

/** The version of the device configuration document and of its acknowledgement. */
export const CONFIG_VERSION = 3 as const;

/** Most channels one device configuration carries. */
export const MAX_CONFIG_CHANNELS = 64;

/**
 * Filter configuration v3, retained on `<rig>/<device>/config`: one document for the whole device
 * (MQTT keeps one retained message per topic, so a per-channel payload would overwrite its siblings).
 * `device` is `<rig>/<device>`; `channels` names every channel of the device, null meaning no filter
 * (pass-through), each entry a chain of stages. `checksum` is the lowercase hex SHA-256 of canonicalJson(document without checksum).
 * The device applies the whole document or none of it.
 */
export const deviceConfigSchema = z
  .object({
    v: z.literal(CONFIG_VERSION),
    device: z.string().max(127).refine(isDevicePath, { error: "device must be <rig>/<device>" }),
    configId,
    channels: z
      .record(key, channelConfigSchema.nullable())
      .refine((c) => Object.keys(c).length >= 1 && Object.keys(c).length <= MAX_CONFIG_CHANNELS, {
        error: `a configuration names 1 to ${MAX_CONFIG_CHANNELS} channels`,
      }),
    checksum,
  })
  .strict();
export type DeviceConfig = z.infer<typeof deviceConfigSchema>;
export type UnsignedDeviceConfig = Omit<DeviceConfig, "checksum">;

/** Published by the device on `<rig>/<device>/ack` after it checked a configuration document. */
export const deviceAckSchema = z
  .object({
    v: z.literal(CONFIG_VERSION),
    configId,
    checksum,
    status: z.enum(["applied", "refused"]),
    reason: z.string().max(200).optional(),
  })
  .strict();
export type DeviceAck = z.infer<typeof deviceAckSchema>;

function isDevicePath(path: string): boolean {
  const parts = path.split("/");
  return parts.length === 2 && parts.every((p) => KEY_PATTERN.test(p));
}

/** The object the checksum is computed over: the document without its checksum field. */
export function checksumSubject(config: DeviceConfig | UnsignedDeviceConfig): UnsignedDeviceConfig {
  const { v, device, configId, channels } = config;
  return { v, device, configId, channels };
}
