import { describe, expect, it } from "vitest";
import { Slab } from "@/lib/protocol/slab";

/** Views handed out by a slab never share a byte, start 8-byte aligned, and arrive zeroed. */
describe("Slab", () => {
  it("hands out zeroed, aligned views that never overlap, across full buffers", () => {
    const slab = new Slab(256);
    const taken: Uint8Array[] = [];
    for (const size of [1, 7, 8, 9, 40, 63, 64, 3, 17, 33, 50, 1, 64, 64, 64, 64, 5]) {
      const view = slab.bytes(size);
      expect(view.byteLength).toBe(size);
      expect(view.byteOffset % 8).toBe(0);
      expect(view.every((b) => b === 0)).toBe(true);
      view.fill(0xff);
      taken.push(view);
    }
    // Every byte written once: no view was written over by a later one.
    for (const view of taken) expect(view.every((b) => b === 0xff)).toBe(true);
    const spans = taken.map((v) => ({ buffer: v.buffer, from: v.byteOffset, to: v.byteOffset + v.byteLength }));
    for (const [i, a] of spans.entries()) {
      for (const b of spans.slice(i + 1)) if (a.buffer === b.buffer) expect(a.to <= b.from || b.to <= a.from).toBe(true);
    }
  });

  it("gives float64 views of the count asked, and a request over a quarter of a buffer a buffer of its own", () => {
    const slab = new Slab(256);
    const small = slab.float64(5);
    expect(small).toBeInstanceOf(Float64Array);
    expect(small.length).toBe(5);
    expect(small.byteOffset % 8).toBe(0);
    const large = slab.bytes(65);
    expect(large.byteOffset).toBe(0);
    expect(large.buffer.byteLength).toBe(65);
    expect(slab.float64(1).buffer).toBe(small.buffer);
  });
});
