import { createHash } from "node:crypto";
import type { StoredChannelConfig } from "@/lib/coefficients";
import { canonicalJson, checksumSubject, type DeviceConfig, type UnsignedDeviceConfig } from "@/lib/protocol";

/** Lowercase hex SHA-256 (FIPS 180-4) of canonicalJson(value). */
function canonicalSha256(value: StoredChannelConfig | UnsignedDeviceConfig): string {
  return createHash("sha256").update(canonicalJson(value), "utf8").digest("hex");
}

/** The device configuration's checksum: over the document without its checksum field. */
export function configChecksum(config: DeviceConfig | UnsignedDeviceConfig): string {
  return canonicalSha256(checksumSubject(config));
}

/**
 * A channel entry's content hash, as lib/coefficients channelConfigChecksum computes it in the browser;
 * also of entries stored in the form before chains, which keep the hash they were stored with.
 */
export function channelConfigChecksum(entry: StoredChannelConfig): string {
  return canonicalSha256(entry);
}

export function signConfig(config: UnsignedDeviceConfig): DeviceConfig {
  return { ...checksumSubject(config), checksum: configChecksum(config) };
}

export function checksumMatches(config: DeviceConfig): boolean {
  return configChecksum(config) === config.checksum;
}
