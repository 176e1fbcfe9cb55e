import {
  channelConfigEntry,
  currentChannelConfig,
  DeploymentRefusal,
  quantizeForTarget,
  type DeploymentTarget,
  type StoredChannelConfig,
  type StoredCoefficients,
} from "@/lib/coefficients";
import { AppError } from "@/lib/errors";
import { channelConfigSchema, type ChannelConfig } from "@/lib/protocol";
import type { DeploymentKind } from "./states";

/** A target channel as the promotion rules need it. */
export interface TargetChannel {
  path: string;
  deviceKey: string;
  key: string;
  sampleRateHz: number;
  coefficientFormat: DeploymentTarget["format"];
  maxSections: number;
  maxFirTaps: number;
}

function targetOf(ch: TargetChannel): DeploymentTarget {
  return {
    label: `${ch.deviceKey}/${ch.key}`,
    sampleRateHz: ch.sampleRateHz,
    format: ch.coefficientFormat,
    capacity: { maxSections: ch.maxSections, maxFirTaps: ch.maxFirTaps },
  };
}

/**
 * The channel entry a promotion sends: the revision quantized for the channel's device. Refused (422)
 * for another sample rate, an unstable design or quantized form, or more than the device runs.
 */
export function promotionEntry(rev: StoredCoefficients & { id: number }, channel: TargetChannel): ChannelConfig {
  try {
    const target = targetOf(channel);
    return channelConfigEntry(String(rev.id), target, quantizeForTarget(rev, target));
  } catch (err) {
    if (err instanceof DeploymentRefusal) throw new AppError("unprocessable", `Refused for ${channel.path}: ${err.message}.`);
    throw err;
  }
}

/** A channel's active deployment as a rollback sees it. */
export interface ActiveDeploymentRef {
  id: number;
  revisionId: number;
  previousId: number | null;
  passThrough: boolean;
}

/**
 * A rollback may go ahead only from the active deployment the person saw (409 otherwise) and not
 * from a channel that already runs no filter (409). Returns that active deployment.
 */
export function checkRollback(active: ActiveDeploymentRef | undefined, expectedActiveId: number, channelPath: string): ActiveDeploymentRef {
  if (!active || active.id !== expectedActiveId) {
    throw new AppError("conflict", `The active filter on ${channelPath} changed since you looked. Reload and try again.`);
  }
  if (active.passThrough) throw new AppError("conflict", `${channelPath} already runs no filter; promote a revision to filter it again.`);
  return active;
}

/** The entry that runs no filter on a channel: the stored entry's format and rate with an empty stage list. */
export function passThroughEntry(stored: StoredChannelConfig): ChannelConfig {
  return channelConfigSchema.parse({ ...currentChannelConfig(stored), stages: [] });
}

/** What an acknowledged deployment does to the channel's previous active one, and how it is recorded and announced. */
export function activationOutcome(kind: DeploymentKind): { previousEnds: "rolled_back" | "superseded"; auditAction: string; mail: "rolled_back" | "promoted" } {
  return kind === "rollback"
    ? { previousEnds: "rolled_back", auditAction: "deployment.rolled_back", mail: "rolled_back" }
    : { previousEnds: "superseded", auditAction: "deployment.activate", mail: "promoted" };
}
