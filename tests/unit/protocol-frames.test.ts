import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { bundleFrames, decodeFrame, decodeFrames, encodeFrame, FRAME_HEADER_BYTES, type FrameMessage } from "@/lib/protocol";

const frame: FrameMessage<number[]> = {
  type: "frame",
  channel: "gearbox-endurance/torque-node/input-torque",
  seq: 4_000_000_123,
  t0: 1_700_000_000_000.5,
  sampleRateHz: 2000,
  raw: [1, -2.5, 3.25],
  traces: { production: [0.5, 0.25, 0.125], "cand-1": [7, 8, 9] },
  samples: 3,
  decimated: false,
};

function decoded(bytes: Uint8Array): FrameMessage {
  const result = decodeFrame(bytes);
  if (!result.ok) throw new Error(result.reason);
  return result.frame;
}

describe("binary frames (protocol 2)", () => {
  it("round-trips every field, columns as float32", () => {
    const back = decoded(encodeFrame(frame));
    expect(back).toMatchObject({ type: "frame", channel: frame.channel, seq: frame.seq, t0: frame.t0, sampleRateHz: 2000, samples: 3, decimated: false });
    expect(back.bucketSamples).toBeUndefined();
    expect(back.raw).toBeInstanceOf(Float32Array);
    expect(Array.from(back.raw)).toEqual(frame.raw);
    expect(Object.keys(back.traces)).toEqual(["production", "cand-1"]);
    expect(Array.from(back.traces["cand-1"])).toEqual([7, 8, 9]);
  });

  it("round-trips decimated frames and any values as their float32 rounding (property)", () => {
    fc.assert(
      fc.property(
        fc.array(fc.double({ noNaN: true, min: -1e30, max: 1e30 }), { minLength: 1, maxLength: 64 }),
        fc.integer({ min: 1, max: 5000 }),
        fc.integer({ min: 0, max: 0xffffffff }),
        (raw, bucket, seq) => {
          const f: FrameMessage<number[]> = { ...frame, seq, raw, traces: { x: raw.map((v) => -v) }, decimated: true, bucketSamples: bucket };
          const back = decoded(encodeFrame(f));
          expect(Array.from(back.raw)).toEqual(raw.map(Math.fround));
          expect(Array.from(back.traces.x)).toEqual(raw.map((v) => Math.fround(-v)));
          expect(back.bucketSamples).toBe(bucket);
          expect(back.seq).toBe(seq);
        },
      ),
    );
  });

  it("puts the columns on a 4-byte boundary after the names", () => {
    const bytes = encodeFrame(frame);
    const names = `${frame.channel}\nproduction\ncand-1`.length;
    expect(bytes.byteLength).toBe(FRAME_HEADER_BYTES + Math.ceil(names / 4) * 4 + 4 * 3 * 3);
  });

  it("writes each column as little-endian IEEE 754 binary32, whatever the machine's byte order", () => {
    const bytes = encodeFrame(frame);
    const columns = FRAME_HEADER_BYTES + Math.ceil(`${frame.channel}\nproduction\ncand-1`.length / 4) * 4;
    // IEEE Std 754-2019, §3.4 (binary32: sign, 8-bit exponent biased by 127, 23-bit fraction):
    // 1 = 0x3F800000, −2.5 = 0xC0200000, 3.25 = 0x40500000; least significant byte first on the wire.
    expect(Array.from(bytes.subarray(columns, columns + 12))).toEqual([0x00, 0x00, 0x80, 0x3f, 0x00, 0x00, 0x20, 0xc0, 0x00, 0x00, 0x50, 0x40]);
  });

  it("refuses malformed input with a reason", () => {
    const good = encodeFrame(frame);
    const with_ = (edit: (b: Uint8Array, v: DataView) => void) => {
      const b = good.slice();
      edit(b, new DataView(b.buffer));
      return b;
    };
    const bad: Array<[string, Uint8Array]> = [
      ["empty", new Uint8Array(0)],
      ["short header", good.slice(0, FRAME_HEADER_BYTES - 1)],
      ["truncated column", good.slice(0, good.byteLength - 1)],
      ["extra byte", new Uint8Array([...good, 0])],
      ["magic", with_((b) => (b[0] = 0x7b))],
      ["version 1", with_((b) => (b[1] = 1))],
      ["unknown flag", with_((b) => (b[2] = 2))],
      ["decimated without bucket", with_((b) => (b[2] = 1))],
      ["bucket without decimation", with_((_b, v) => v.setUint32(12, 4, true))],
      ["zero samples", with_((_b, v) => v.setUint32(8, 0, true))],
      ["more traces than names", with_((b) => (b[3] = 3))],
      ["huge point count", with_((_b, v) => v.setUint32(16, 0xffffffff, true))],
      ["NaN rate", with_((_b, v) => v.setFloat64(32, Number.NaN, true))],
      ["negative rate", with_((_b, v) => v.setFloat64(32, -1, true))],
      ["infinite t0", with_((_b, v) => v.setFloat64(24, Infinity, true))],
      ["bad channel key", with_((b) => (b[FRAME_HEADER_BYTES] = "A".charCodeAt(0)))],
      ["not UTF-8", with_((b) => (b[FRAME_HEADER_BYTES + 1] = 0xff))],
    ];
    for (const [what, bytes] of bad) expect(decodeFrame(bytes).ok, what).toBe(false);
  });

  it("refuses to encode what no decoder would accept", () => {
    expect(() => encodeFrame({ ...frame, raw: [] })).toThrow(/at least one point/);
    expect(() => encodeFrame({ ...frame, channel: "a/b" })).toThrow(/channel path/);
    expect(() => encodeFrame({ ...frame, traces: { "has space": [1, 2, 3] } })).toThrow(/trace id/);
    expect(() => encodeFrame({ ...frame, traces: { production: [1] } })).toThrow(/1 points, raw has 3/);
  });
});

describe("several frames in one binary message (protocol 3)", () => {
  const second: FrameMessage<number[]> = { ...frame, channel: "hydraulic-press/env-node/frame-strain", seq: 7, raw: [4], traces: {}, samples: 1 };
  const third: FrameMessage<number[]> = { ...frame, raw: [1, 2, 3, 4, 5, 6], traces: { a: [6, 5, 4, 3, 2, 1] }, samples: 60, decimated: true, bucketSamples: 20 };

  it("reads back every frame in order, each as decodeFrame reads it alone", () => {
    const parts = [frame, second, third].map(encodeFrame);
    const result = decodeFrames(bundleFrames(parts));
    if (!result.ok) throw new Error(result.reason);
    expect(result.frames).toEqual(parts.map(decoded));
    expect(result.frames.map((f) => f.channel)).toEqual([frame.channel, second.channel, third.channel]);
  });

  it("reads a message of one frame, and sends a single frame as it is", () => {
    const one = encodeFrame(frame);
    expect(bundleFrames([one])).toBe(one);
    const result = decodeFrames(one);
    expect(result.ok && result.frames.length).toBe(1);
  });

  it("refuses the whole message when any frame in it is bad, naming which", () => {
    const [a, b] = [encodeFrame(frame), encodeFrame(second)];
    const badSecond = b.slice();
    badSecond[1] = 1; // version 1
    const cases: Array<[string, Uint8Array, RegExp]> = [
      ["empty", new Uint8Array(0), /empty/],
      ["second frame truncated", bundleFrames([a, b.slice(0, b.byteLength - 2)]), /frame 2: shorter/],
      ["trailing bytes shorter than a header", bundleFrames([a, new Uint8Array(5)]), /frame 2: shorter/],
      ["second frame of another version", bundleFrames([a, badSecond]), /frame 2: frame version 1/],
    ];
    for (const [what, bytes, reason] of cases) {
      const result = decodeFrames(bytes);
      expect(result.ok, what).toBe(false);
      if (!result.ok) expect(result.reason, what).toMatch(reason);
    }
  });
});
