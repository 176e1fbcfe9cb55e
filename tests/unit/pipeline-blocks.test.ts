import { describe, expect, it } from "vitest";
import { filterSignal, liveDesign } from "@/lib/dsp";
import { createPipeline } from "@/server/pipeline/pipeline";

const PATH = "bench-rig/node-a/strain";
const FS = 1000;
const lowpass = liveDesign({ kind: "iir", family: "butterworth", response: "lowpass", order: 2, cutoffHz: 50, sampleRateHz: FS });

function batch(seq: number, n = 20) {
  return { seq, t0: seq * n, sampleRateHz: FS, values: Float64Array.from({ length: n }, (_, i) => Math.sin(i / 3)) };
}

describe("pipeline blocks", () => {
  it("every trace of a block covers all its raw samples when candidates come and go between batches", () => {
    const pipeline = createPipeline({ channels: [{ path: PATH, sampleRateHz: FS }] });
    pipeline.addCandidate(PATH, "u1", "a", lowpass);
    pipeline.addCandidate(PATH, "u1", "b", lowpass);
    pipeline.push(PATH, batch(0));
    pipeline.removeCandidate(PATH, "u1", "a");
    pipeline.push(PATH, batch(1));
    pipeline.removeOwner("u1");
    pipeline.push(PATH, batch(2));
    const blocks = pipeline.drain(PATH);
    expect(blocks.length).toBe(3);
    for (const block of blocks) {
      for (const trace of block.traces.values()) expect(trace.length).toBe(block.raw.length);
    }
    expect(blocks.map((b) => [...b.traces.keys()].length)).toEqual([2, 1, 0]);
  });

  it("drains exactly the samples pushed since the last drain, tick after tick, with each filter's output as filterSignal gives it", () => {
    const pipeline = createPipeline({ channels: [{ path: PATH, sampleRateHz: FS }] });
    pipeline.addCandidate(PATH, "u1", "a", lowpass);
    const raw: number[] = [];
    const out: number[] = [];
    for (let tick = 0; tick < 20; tick++) {
      const batches = 1 + (tick % 3); // one to three batches a tick
      for (let k = 0; k < batches; k++) {
        const b = batch(raw.length / 20);
        raw.push(...b.values);
        pipeline.push(PATH, b);
      }
      const blocks = pipeline.drain(PATH);
      expect(blocks.length).toBe(1);
      expect(blocks[0].raw.length).toBe(20 * batches);
      expect(Array.from(blocks[0].raw)).toEqual(raw.slice(-20 * batches));
      out.push(...(blocks[0].traces.get("u1/a") ?? []));
    }
    expect(out).toEqual(Array.from(filterSignal(lowpass.design, Float64Array.from(raw), { initial: "step" })));
    expect(pipeline.drain(PATH)).toEqual([]);
  });
});
