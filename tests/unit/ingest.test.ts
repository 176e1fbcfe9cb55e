import { describe, expect, it } from "vitest";
import { encodeBinarySamples, MAX_PAYLOAD_BYTES, samplesTopic, type SampleBatch } from "@/lib/protocol";
import { systemClock } from "@/server/clock";
import { createFaultLog } from "@/server/ingest/fault-log";
import { createIngest } from "@/server/ingest/ingest";

const PATH = "lab-rig/node-a/strain";
const quiet = { info: () => undefined, warn: () => undefined };

function harness() {
  const pushed: Array<{ path: string; batch: SampleBatch }> = [];
  const faults = createFaultLog({ clock: systemClock, logger: quiet });
  const ingest = createIngest({ channels: [{ path: PATH, sampleRateHz: 1000 }], sink: { push: (path, batch) => pushed.push({ path, batch }) }, faults });
  const payload = (seq: number, sampleRateHz = 1000) => encodeBinarySamples({ seq, t0: seq * 10, sampleRateHz, values: Float64Array.from({ length: 10 }, (_, i) => i) });
  return { ingest, pushed, faults, payload };
}

describe("ingest of sample messages", () => {
  it("accepts a known channel's messages again and again, and counts a sequence gap", () => {
    const { ingest, pushed, faults, payload } = harness();
    for (const seq of [0, 1, 2, 4]) ingest.handle(samplesTopic(PATH), payload(seq));
    expect(pushed.map((p) => p.batch.seq)).toEqual([0, 1, 2, 4]);
    expect(ingest.accepted).toEqual({ messages: 4, samples: 40 });
    expect(faults.byChannel()[PATH]).toEqual({ seq_gap: 1 });
  });

  it("refuses in order: topic, size (before and after the topic is known), channel, then the payload's rate", () => {
    const { ingest, pushed, faults, payload } = harness();
    const huge = new Uint8Array(MAX_PAYLOAD_BYTES + 1);
    ingest.handle("tapwright/v1/lab-rig/node-a/strain/sample", payload(0));
    ingest.handle(samplesTopic(PATH), huge);
    ingest.handle(samplesTopic(PATH), payload(0));
    ingest.handle(samplesTopic(PATH), huge);
    ingest.handle(samplesTopic("lab-rig/node-a/other"), payload(0));
    ingest.handle(samplesTopic(PATH), payload(1, 2000));
    expect(pushed).toHaveLength(1);
    expect(faults.totals()).toEqual({ bad_topic: 1, oversized: 2, unknown_channel: 1, rate_mismatch: 1 });
  });

  it("reads a channel's new rate after addChannel, though its topic was seen before", () => {
    const { ingest, pushed, faults, payload } = harness();
    ingest.handle(samplesTopic(PATH), payload(0));
    ingest.addChannel({ path: PATH, sampleRateHz: 2000 });
    ingest.handle(samplesTopic(PATH), payload(1, 2000));
    ingest.handle(samplesTopic(PATH), payload(2, 1000));
    expect(pushed.map((p) => p.batch.sampleRateHz)).toEqual([1000, 2000]);
    expect(faults.totals()).toEqual({ rate_mismatch: 1 });
  });
});
