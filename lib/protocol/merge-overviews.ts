import type { LiveOverview } from "./overview";

const WORST_FIRST: LiveOverview["mqtt"][] = ["closed", "reconnecting", "connected"];

/**
 * One lab-wide overview from the overviews of partitioned sidecars: each reports the channels it
 * filters; a channel reported twice (during a move) keeps the report with the newer sample. The
 * broker link is the worst of theirs, the time the latest.
 */
export function mergeOverviews(parts: readonly LiveOverview[]): LiveOverview {
  if (!parts.length) throw new Error("mergeOverviews needs at least one overview");
  const channels: LiveOverview["channels"] = {};
  for (const part of parts) {
    for (const [path, state] of Object.entries(part.channels)) {
      const held = channels[path];
      if (!held || (state.lastSampleAt ?? -Infinity) > (held.lastSampleAt ?? -Infinity)) channels[path] = state;
    }
  }
  return {
    now: Math.max(...parts.map((p) => p.now)),
    mqtt: WORST_FIRST.find((state) => parts.some((p) => p.mqtt === state)) ?? "closed",
    channels,
  };
}
