import { z } from "zod";

/** Every Tapwright topic starts here; the `v1` level is the payload version (see docs/protocol.md). */
export const TOPIC_ROOT = "tapwright/v1";

/** A rig, device or channel key: lowercase letters, digits and dashes, as the database enforces. */
export const KEY_PATTERN = /^[a-z0-9][a-z0-9-]{0,62}$/;

/** A channel path `<rig>/<device>/<channel>`. */
export const channelPathSchema = z
  .string()
  .max(192)
  .refine(isChannelPath, { error: "channel must be <rig>/<device>/<channel> with keys of a-z, 0-9 and -" });

export function isChannelPath(path: string): boolean {
  const parts = path.split("/");
  return parts.length === 3 && parts.every((p) => KEY_PATTERN.test(p));
}

/** Wildcard for every channel's samples (MQTT 3.1.1 §4.7.1.2: `+` matches one level). */
export const SAMPLES_FILTER = `${TOPIC_ROOT}/+/+/+/samples`;
export const STATUS_FILTER = `${TOPIC_ROOT}/+/+/status`;
export const ACK_FILTER = `${TOPIC_ROOT}/+/+/ack`;

/** The shared-subscription form of a filter (MQTT 5.0 §4.8.2): each message goes to one member of the group. */
export function sharedFilter(group: string, filter: string): string {
  if (!KEY_PATTERN.test(group)) throw new Error(`shared group must match ${KEY_PATTERN} (got '${group}')`);
  return `$share/${group}/${filter}`;
}

export const samplesTopic = (path: string): string => `${TOPIC_ROOT}/${path}/samples`;
export const filteredTopic = (path: string): string => `${TOPIC_ROOT}/${path}/filtered`;
export const statusTopic = (rig: string, device: string): string => `${TOPIC_ROOT}/${rig}/${device}/status`;
export const configTopic = (rig: string, device: string): string => `${TOPIC_ROOT}/${rig}/${device}/config`;
export const ackTopic = (rig: string, device: string): string => `${TOPIC_ROOT}/${rig}/${device}/ack`;

export type ParsedTopic =
  | { kind: "samples" | "filtered"; rig: string; device: string; channel: string; path: string }
  | { kind: "status" | "config" | "ack"; rig: string; device: string };

const CHANNEL_KINDS = new Set(["samples", "filtered"]);
const DEVICE_KINDS = new Set(["status", "config", "ack"]);

/** Reads a Tapwright topic; null for anything else (wrong root, wrong depth, bad keys, unknown leaf). */
export function parseTopic(topic: string): ParsedTopic | null {
  if (!topic.startsWith(`${TOPIC_ROOT}/`)) return null;
  const parts = topic.slice(TOPIC_ROOT.length + 1).split("/");
  const leaf = parts.pop() ?? "";
  if (!parts.every((p) => KEY_PATTERN.test(p))) return null;
  if (parts.length === 3 && CHANNEL_KINDS.has(leaf)) {
    const [rig, device, channel] = parts;
    return { kind: leaf as "samples" | "filtered", rig, device, channel, path: parts.join("/") };
  }
  if (parts.length === 2 && DEVICE_KINDS.has(leaf)) {
    return { kind: leaf as "status" | "config" | "ack", rig: parts[0], device: parts[1] };
  }
  return null;
}
