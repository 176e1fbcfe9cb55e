import { deviceConfigSchema, type DeviceAck } from "@/lib/protocol";
import type { DemoDevice } from "@/lib/demo/lab";
import { checksumMatches } from "../devices/checksum";

/**
 * What a demo device answers to a config payload: "applied" when it parses, its checksum matches,
 * and channel, format and sample rate are this device's; "refused" with the reason otherwise.
 * Null when the payload is too broken to name a revision (nothing to acknowledge).
 */
export function answerConfig(device: DemoDevice, payload: Buffer): DeviceAck | null {
  let json: unknown;
  try {
    json = JSON.parse(payload.toString("utf8"));
  } catch {
    return null;
  }
  const parsed = deviceConfigSchema.safeParse(json);
  if (!parsed.success) {
    const { revisionId, checksum } = (json ?? {}) as { revisionId?: unknown; checksum?: unknown };
    if (typeof revisionId !== "string" || typeof checksum !== "string" || !/^[0-9a-f]{64}$/.test(checksum)) return null;
    return { v: 1, revisionId: revisionId.slice(0, 64), checksum, status: "refused", reason: "malformed config" };
  }
  const config = parsed.data;
  const refuse = (reason: string): DeviceAck => ({ v: 1, revisionId: config.revisionId, checksum: config.checksum, status: "refused", reason });
  if (!checksumMatches(config)) return refuse("checksum mismatch");
  const channel = device.channels.find((c) => c.key === config.channel);
  if (!channel) return refuse(`no channel ${config.channel} on this device`);
  if (config.format !== device.coefficientFormat) return refuse(`this device runs ${device.coefficientFormat}, not ${config.format}`);
  if (config.sampleRateHz !== channel.sampleRateHz) return refuse(`channel runs at ${channel.sampleRateHz} Hz`);
  return { v: 1, revisionId: config.revisionId, checksum: config.checksum, status: "applied" };
}
