import { describe, expect, it } from "vitest";
import {
  clientMessageSchema,
  isChannelPath,
  parseTopic,
  samplesTopic,
  serverMessageSchema,
  sharedFilter,
  SAMPLES_FILTER,
} from "@/lib/protocol";

describe("topics", () => {
  it("builds and parses the v1 topics", () => {
    expect(samplesTopic("a/b/c")).toBe("tapwright/v1/a/b/c/samples");
    expect(parseTopic("tapwright/v1/a/b/c/samples")).toEqual({ kind: "samples", rig: "a", device: "b", channel: "c", path: "a/b/c" });
    expect(parseTopic("tapwright/v1/a/b/config")).toEqual({ kind: "config", rig: "a", device: "b" });
    for (const bad of ["tapwright/v2/a/b/c/samples", "tapwright/v1/a/b/samples", "tapwright/v1/A/b/c/samples", "tapwright/v1/a/b/c/other", "x"]) {
      expect(parseTopic(bad), bad).toBeNull();
    }
    expect(sharedFilter("grp", SAMPLES_FILTER)).toBe("$share/grp/tapwright/v1/+/+/+/samples");
    expect(() => sharedFilter("a/b", SAMPLES_FILTER)).toThrow();
    expect(isChannelPath("rig/dev/ch")).toBe(true);
    expect(isChannelPath("rig/dev")).toBe(false);
  });
});

describe("WebSocket client messages", () => {
  const spec = { kind: "iir", family: "butterworth", response: "lowpass", order: 2, cutoffHz: 40, sampleRateHz: 1000 };
  it("accepts the documented shapes", () => {
    for (const m of [
      { type: "subscribe", channel: "a/b/c" },
      { type: "unsubscribe", channel: "a/b/c" },
      { type: "candidate.add", channel: "a/b/c", id: "lp-1", spec },
      { type: "candidate.remove", channel: "a/b/c", id: "lp-1" },
      { type: "window", channel: "a/b/c", seconds: 10, maxPoints: 2000 },
      { type: "noise-line", channel: "a/b/c", freqHz: 49.98 },
      { type: "noise-line", channel: "a/b/c", freqHz: null },
    ]) {
      expect(clientMessageSchema.safeParse(m).success, m.type).toBe(true);
    }
  });

  it("takes a chain as a candidate's spec, and refuses a bad chain naming the stage", () => {
    const chain = { kind: "chain", sampleRateHz: 1000, stages: [{ kind: "biquad", shape: "notch", centerHz: 50, q: 5, sampleRateHz: 1000 }, spec] };
    expect(clientMessageSchema.safeParse({ type: "candidate.add", channel: "a/b/c", id: "hum", spec: chain }).success).toBe(true);
    const issue = (bad: unknown) => clientMessageSchema.safeParse({ type: "candidate.add", channel: "a/b/c", id: "hum", spec: bad }).error?.issues[0];
    expect(issue({ ...chain, stages: [chain.stages[0], { ...spec, sampleRateHz: 500 }] })).toMatchObject({
      path: ["spec", "stages", 1, "sampleRateHz"],
      message: "stage 2 is designed for 500 Hz but the chain runs at 1000 Hz; every stage must use the chain's sample rate",
    });
    expect(issue({ ...chain, stages: [chain] })?.message).toMatch(/cannot hold another chain/);
    expect(issue({ ...chain, stages: [] })?.message).toBe("a chain needs at least 1 stage (got 0)");
  });

  it("refuses bad paths, ids, specs, windows and extra fields", () => {
    for (const m of [
      { type: "subscribe", channel: "a/b" },
      { type: "subscribe", channel: "a/b/c", extra: 1 },
      { type: "candidate.add", channel: "a/b/c", id: "has space", spec },
      { type: "candidate.add", channel: "a/b/c", id: "x", spec: { ...spec, cutoffHz: 600 } },
      { type: "window", channel: "a/b/c", seconds: 61, maxPoints: 2000 },
      { type: "window", channel: "a/b/c", seconds: 0.5, maxPoints: 2000 },
      { type: "noise-line", channel: "a/b/c", freqHz: 0 },
      { type: "noise-line", channel: "a/b/c", freqHz: -50 },
      { type: "noise-line", channel: "a/b/c" },
      { type: "nope" },
    ]) {
      expect(clientMessageSchema.safeParse(m).success, JSON.stringify(m)).toBe(false);
    }
  });

  it("describes the server's status and error control messages; frames are not JSON messages any more", () => {
    const frame = { type: "frame", channel: "a/b/c", seq: 1, t0: 0, sampleRateHz: 1000, raw: [1, 2], traces: { production: [1, 2] }, samples: 2, decimated: false };
    expect(serverMessageSchema.safeParse(frame).success).toBe(false);
    expect(serverMessageSchema.safeParse({ type: "status", mqtt: "reconnecting", droppedFrames: 3, faults: { "a/b/c": { seq_gap: 2 } } }).success).toBe(true);
    expect(serverMessageSchema.safeParse({ type: "error", code: "forbidden", message: "no" }).success).toBe(true);
    expect(serverMessageSchema.safeParse({ type: "error", code: "teapot", message: "no" }).success).toBe(false);
  });
});
