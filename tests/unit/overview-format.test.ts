import { describe, expect, it } from "vitest";
import { envelopePoints, faultSummary, sampleAge } from "@/components/overview/format";
import { liveOverviewSchema } from "@/lib/protocol";

describe("overview card wording", () => {
  it("reads an age as fresh up to 5 s and as stale after, in s, min or h", () => {
    expect(sampleAge(null)).toEqual({ text: "no samples yet", stale: true });
    expect(sampleAge(-30)).toEqual({ text: "0.0 s ago", stale: false });
    expect(sampleAge(230)).toEqual({ text: "0.2 s ago", stale: false });
    expect(sampleAge(5_000)).toEqual({ text: "5.0 s ago", stale: false });
    expect(sampleAge(12_400)).toEqual({ text: "stale 12 s", stale: true });
    expect(sampleAge(4 * 60_000 + 5)).toEqual({ text: "stale 4 min", stale: true });
    expect(sampleAge(3 * 3_600_000)).toEqual({ text: "stale 3 h", stale: true });
  });

  it("lists fault counts largest first and leaves zeros out", () => {
    expect(faultSummary({})).toBe("");
    expect(faultSummary({ bad_json: 1, seq_gap: 3, oversized: 0 })).toBe("3 lost batches · 1 message not JSON");
    expect(faultSummary({ rate_mismatch: 2 })).toBe("2 messages at the wrong sample rate");
  });
});

describe("sparkline envelope", () => {
  it("goes along the maxima and back along the minima, scaled to the box with y down", () => {
    expect(envelopePoints([0, 1], [2, 4], 100, 20)).toBe("0.0,10.0 100.0,0.0 100.0,15.0 0.0,20.0");
  });

  it("puts a flat or single-bucket envelope on the middle line", () => {
    expect(envelopePoints([5, 5], [5, 5], 10, 8)).toBe("0.0,4.0 10.0,4.0 10.0,4.0 0.0,4.0");
    expect(envelopePoints([1], [3], 10, 8)).toBe("5.0,0.0 5.0,8.0");
    expect(envelopePoints([], [], 10, 8)).toBe("");
  });
});

describe("the overview schema the route handler applies to the sidecar's reply", () => {
  const channel = { online: null, lastSampleAt: null, productionRevisionId: null, spark: null, faults: {}, faultsSince: 0 };

  it("accepts the sidecar's shape and refuses unknown fault kinds or ragged sparks", () => {
    expect(liveOverviewSchema.safeParse({ now: 1, mqtt: "connected", channels: { "a/b/c": channel } }).success).toBe(true);
    expect(liveOverviewSchema.safeParse({ now: 1, mqtt: "connected", channels: { "a/b/c": { ...channel, faults: { nope: 1 } } } }).success).toBe(false);
    const ragged = { ...channel, spark: { t0: 0, stepMs: 500, min: [1, 2], max: [3] } };
    expect(liveOverviewSchema.safeParse({ now: 1, mqtt: "connected", channels: { "a/b/c": ragged } }).success).toBe(false);
  });
});
