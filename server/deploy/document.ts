import type { Db } from "@/db/client";
import { listDeviceChannelStates, type DeploymentView } from "@/db/queries/deployments";
import { currentChannelConfig } from "@/lib/coefficients";
import { CONFIG_VERSION, type ChannelConfig, type DeviceConfig } from "@/lib/protocol";
import { channelConfigChecksum, signConfig } from "../devices/checksum";

/** The device a document goes to. */
export interface DeviceRef {
  id: number;
  rigKey: string;
  key: string;
}

/**
 * The retained configuration document of a device, built from the database: every channel of the
 * device with its active entry, except the channel of `deploying`, which gets that deployment's entry
 * (its pending revision, or for a rollback the target). Every entry is checked against the checksum
 * stored with it, so a damaged row never reaches a device, and then written in the current form
 * (an entry stored before chains becomes one sections stage, every word as stored). Without `deploying` it is the document of
 * what is active now, used to put the previous document back after a failure.
 */
export async function buildDeviceDocument(db: Db, device: DeviceRef, configId: string, deploying: DeploymentView | null): Promise<DeviceConfig> {
  const channels: Record<string, ChannelConfig | null> = {};
  for (const state of await listDeviceChannelStates(db, device.id)) {
    const stored = deploying?.channelId === state.channelId ? deploying : state.active;
    if (stored && channelConfigChecksum(stored.config) !== stored.checksum) {
      throw new Error(`the stored config of ${device.rigKey}/${device.key}/${state.channelKey} does not match its checksum`);
    }
    channels[state.channelKey] = stored ? currentChannelConfig(stored.config) : null;
  }
  return signConfig({ v: CONFIG_VERSION, device: `${device.rigKey}/${device.key}`, configId, channels });
}
