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
const floatSection = z.array(z.number()).length(6).refine((row) => row[3] === 1, { error: "a0 must be 1" });

/** One fixed-point section: words [b0, b1, b2, a1, a2] in Qn (n = 15 or 31); coefficient = word · 2^(shift − n). */
const fixedSection = (bits: 15 | 31) =>
  z
    .object({
      words: z.array(z.number().int().min(-(2 ** bits)).max(2 ** bits - 1)).length(5),
      shift: z.number().int().min(0).max(bits),
    })
    .strict();

const channelConfigBase = {
  revisionId,
  sampleRateHz: z.number().positive(),
};

/**
 * One channel's filter inside a device configuration: the revision, the coefficient format, the
 * sample rate it was designed for and its sections; an empty `sections` list is a unit filter.
 */
export const channelConfigSchema = z.discriminatedUnion("format", [
  z.object({ ...channelConfigBase, format: z.literal("f32"), sections: z.array(floatSection).max(64) }).strict(),
  z.object({ ...channelConfigBase, format: z.literal("q15"), sections: z.array(fixedSection(15)).max(64) }).strict(),
  z.object({ ...channelConfigBase, format: z.literal("q31"), sections: z.array(fixedSection(31)).max(64) }).strict(),
]);
export type ChannelConfig = z.infer<typeof channelConfigSchema>;

/** Most channels one device configuration carries. */
export const MAX_CONFIG_CHANNELS = 64;

/**
 * Filter configuration v2, retained on `<rig>/<device>/config`: one document for the whole device
 * (MQTT keeps one retained message per topic, so a per-channel payload would overwrite its siblings).
 * `device` is `<rig>/<device>`; `channels` names every channel of the device, null meaning no filter
 * (pass-through). `checksum` is the lowercase hex SHA-256 of canonicalJson(document without checksum).
 * The device applies the whole document or none of it.
 */
export const deviceConfigSchema = z
  .object({
    v: z.literal(2),
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
    v: z.literal(2),
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
