import { CONFIG_VERSION, deviceConfigSchema, stageCounts, type DeviceAck, type DeviceConfig } from "@/lib/protocol";
import type { DemoDevice } from "@/lib/demo/lab";
import { checksumMatches } from "../devices/checksum";

/**
 * What a demo device answers to a configuration document (v3): "applied" when it parses, its
 * checksum matches, it is addressed to this device, and it names exactly this device's channels,
 * each in the device's format at the channel's sample rate with a chain that fits the channel's
 * capacity (or null, pass-through); "refused" with the first reason otherwise. The document is applied
 * whole or not at all. Null when the payload is too broken to name a configId and checksum (nothing to
 * acknowledge).
 */
export function answerConfig(rigKey: string, device: DemoDevice, payload: Buffer): DeviceAck | null {
  let json: unknown;
  try {
    json = JSON.parse(payload.toString("utf8"));
  } catch {
    return null;
  }
  const parsed = deviceConfigSchema.safeParse(json);
  if (!parsed.success) {
    const { configId, checksum } = (json ?? {}) as { configId?: unknown; checksum?: unknown };
    if (typeof configId !== "string" || typeof checksum !== "string" || !/^[0-9a-f]{64}$/.test(checksum)) return null;
    return { v: CONFIG_VERSION, configId: configId.slice(0, 64), checksum, status: "refused", reason: "malformed config" };
  }
  const config = parsed.data;
  const reason = refusalReason(rigKey, device, config);
  const ack = { v: CONFIG_VERSION, configId: config.configId, checksum: config.checksum };
  return reason ? { ...ack, status: "refused", reason } : { ...ack, status: "applied" };
}

function refusalReason(rigKey: string, device: DemoDevice, config: DeviceConfig): string | null {
  if (!checksumMatches(config)) return "checksum mismatch";
  if (config.device !== `${rigKey}/${device.key}`) return `addressed to ${config.device}, not this device`;
  for (const key of Object.keys(config.channels)) {
    if (!device.channels.some((c) => c.key === key)) return `no channel ${key} on this device`;
  }
  for (const channel of device.channels) {
    if (!Object.hasOwn(config.channels, channel.key)) return `no entry for channel ${channel.key}`;
    const entry = config.channels[channel.key];
    if (entry === null) continue;
    if (entry.format !== device.coefficientFormat) return `${channel.key}: this device runs ${device.coefficientFormat}, not ${entry.format}`;
    if (entry.sampleRateHz !== channel.sampleRateHz) return `${channel.key}: channel runs at ${channel.sampleRateHz} Hz`;
    const { sections, taps } = stageCounts(entry.stages);
    const { maxSections, maxFirTaps } = channel.capacity;
    if (sections > maxSections || taps > maxFirTaps) {
      return `${channel.key}: ${sections} sections and ${taps} taps exceed this channel's ${maxSections} sections and ${maxFirTaps} taps`;
    }
  }
  return null;
}
