import { describe, expect, it } from "vitest";
import { mergeOverviews, type ChannelLiveState, type LiveOverview } from "@/lib/protocol";

const state = (lastSampleAt: number | null, productionRevisionId: string | null = null): ChannelLiveState => ({
  online: true,
  lastSampleAt,
  productionRevisionId,
  spark: null,
  faults: {},
  faultsSince: 0,
});

describe("the overview of partitioned sidecars", () => {
  it("joins their channels, keeps the newer report of a channel seen twice, the worst broker link and the latest time", () => {
    const a: LiveOverview = { now: 100, mqtt: "connected", channels: { "r/d/a": state(90), "r/d/moving": state(50, "1") } };
    const b: LiveOverview = { now: 120, mqtt: "reconnecting", channels: { "r/d/b": state(null), "r/d/moving": state(110, "2") } };
    const merged = mergeOverviews([a, b]);
    expect(Object.keys(merged.channels).sort()).toEqual(["r/d/a", "r/d/b", "r/d/moving"]);
    expect(merged.channels["r/d/moving"].productionRevisionId).toBe("2");
    expect(merged.mqtt).toBe("reconnecting");
    expect(merged.now).toBe(120);
  });

  it("passes one sidecar's overview through unchanged", () => {
    const only: LiveOverview = { now: 5, mqtt: "connected", channels: { "r/d/a": state(4) } };
    expect(mergeOverviews([only])).toEqual(only);
  });

  it("refuses an empty list", () => {
    expect(() => mergeOverviews([])).toThrow(/at least one/);
  });
});
