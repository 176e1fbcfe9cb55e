import { describe, expect, it } from "vitest";
import { SampleRing } from "@/server/pipeline/ring";

/** The ring against the obvious model: an array of everything pushed, of which the newest `capacity` are held. */
describe("SampleRing", () => {
  it("keeps the newest samples in order across every wrap, for pushes shorter and longer than the ring", () => {
    const capacity = 7;
    const ring = new SampleRing(capacity);
    const all: number[] = [];
    let next = 0;
    for (const size of [1, 3, 5, 7, 2, 9, 16, 4, 6, 1, 13]) {
      const values = Float64Array.from({ length: size }, () => next++);
      ring.push(values);
      all.push(...values);
      expect(ring.written).toBe(all.length);
      const held = Math.min(all.length, capacity);
      for (let n = 0; n <= capacity + 2; n++) {
        for (let end = 0; end <= held; end++) {
          const count = Math.max(0, Math.min(n, held - end));
          expect(Array.from(ring.latest(n, end))).toEqual(all.slice(all.length - end - count, all.length - end));
        }
      }
    }
  });

  it("refuses a capacity that is not a whole number of samples", () => {
    expect(() => new SampleRing(0)).toThrow(/capacity/);
    expect(() => new SampleRing(2.5)).toThrow(/capacity/);
  });
});
