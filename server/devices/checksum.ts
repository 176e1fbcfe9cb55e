import { createHash } from "node:crypto";
import { canonicalJson, checksumSubject, type DeviceConfig, type UnsignedDeviceConfig } from "@/lib/protocol";

/** Lowercase hex SHA-256 (FIPS 180-4) of the canonical JSON of a config without its checksum. */
export function configChecksum(config: DeviceConfig | UnsignedDeviceConfig): string {
  return createHash("sha256").update(canonicalJson(checksumSubject(config)), "utf8").digest("hex");
}

export function signConfig(config: UnsignedDeviceConfig): DeviceConfig {
  return { ...config, checksum: configChecksum(config) } as DeviceConfig;
}

export function checksumMatches(config: DeviceConfig): boolean {
  return configChecksum(config) === config.checksum;
}
