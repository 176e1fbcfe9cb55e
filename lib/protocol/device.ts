import { z } from "zod";
import { KEY_PATTERN } from "./topics";

/** Retained on `<rig>/<device>/status`; the broker publishes the offline form as the device's last will. */
export const deviceStatusSchema = z.object({ state: z.enum(["online", "offline"]) }).strict();
export type DeviceStatus = z.infer<typeof deviceStatusSchema>;

export const COEFFICIENT_FORMATS = ["f32", "q15", "q31"] as const;
export type ConfigFormat = (typeof COEFFICIENT_FORMATS)[number];

const key = z.string().regex(KEY_PATTERN);
const revisionId = z.string().min(1).max(64);
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

const configBase = {
  v: z.literal(1),
  revisionId,
  channel: key,
  sampleRateHz: z.number().positive(),
  checksum,
};

/**
 * Filter configuration v1 sent retained on `<rig>/<device>/config`. `checksum` is the lowercase hex
 * SHA-256 of canonicalJson(payload without checksum); an empty `sections` list means pass-through.
 */
export const deviceConfigSchema = z.discriminatedUnion("format", [
  z.object({ ...configBase, format: z.literal("f32"), sections: z.array(floatSection).max(64) }).strict(),
  z.object({ ...configBase, format: z.literal("q15"), sections: z.array(fixedSection(15)).max(64) }).strict(),
  z.object({ ...configBase, format: z.literal("q31"), sections: z.array(fixedSection(31)).max(64) }).strict(),
]);
export type DeviceConfig = z.infer<typeof deviceConfigSchema>;
export type UnsignedDeviceConfig = DeviceConfig extends infer C ? (C extends DeviceConfig ? Omit<C, "checksum"> : never) : never;

/** Published by the device on `<rig>/<device>/ack` after it checked a config. */
export const deviceAckSchema = z
  .object({
    v: z.literal(1),
    revisionId,
    checksum,
    status: z.enum(["applied", "refused"]),
    reason: z.string().max(200).optional(),
  })
  .strict();
export type DeviceAck = z.infer<typeof deviceAckSchema>;

/** The object the checksum is computed over: the config without its checksum field. */
export function checksumSubject(config: DeviceConfig | UnsignedDeviceConfig): UnsignedDeviceConfig {
  const { checksum: _omit, ...rest } = config as DeviceConfig;
  return rest as UnsignedDeviceConfig;
}
