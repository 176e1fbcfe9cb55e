import fc from "fast-check";
import { describe, expect, it } from "vitest";
import {
  BINARY_HEADER_BYTES,
  decodeSamples,
  encodeBinarySamples,
  MAX_PAYLOAD_BYTES,
  MAX_VALUES,
} from "@/lib/protocol";

describe("binary sample payload v1", () => {
  it("round-trips seq, t0, sample rate and float32 values", () => {
    fc.assert(
      fc.property(
        fc.nat({ max: 0xffffffff }),
        fc.double({ min: 0, max: 4e12, noNaN: true }),
        fc.double({ min: 0.001, max: 1e6, noNaN: true }),
        fc.array(fc.float({ noNaN: true, noDefaultInfinity: true }), { minLength: 1, maxLength: 300 }),
        (seq, t0, sampleRateHz, values) => {
          const bytes = encodeBinarySamples({ seq, t0, sampleRateHz, values });
          expect(bytes.byteLength).toBe(BINARY_HEADER_BYTES + 4 * values.length);
          const result = decodeSamples(bytes);
          expect(result.ok).toBe(true);
          if (!result.ok) return;
          expect(result.batch.seq).toBe(seq);
          expect(result.batch.t0).toBe(t0);
          expect(result.batch.sampleRateHz).toBe(sampleRateHz);
          expect(Array.from(result.batch.values)).toEqual(values);
        },
      ),
      { seed: 7, numRuns: 300 },
    );
  });

  it("decodes from a payload at an odd offset inside a larger buffer (as MQTT hands it over)", () => {
    const bytes = encodeBinarySamples({ seq: 3, t0: 1.5, sampleRateHz: 2000, values: [0.25, -1, 3] });
    const pool = new Uint8Array(bytes.byteLength + 13);
    pool.set(bytes, 5);
    const result = decodeSamples(pool.subarray(5, 5 + bytes.byteLength));
    expect(result).toEqual({ ok: true, batch: { seq: 3, t0: 1.5, sampleRateHz: 2000, values: Float64Array.from([0.25, -1, 3]) } });
  });

  it("has the documented header layout", () => {
    const bytes = encodeBinarySamples({ seq: 0x01020304, t0: 1, sampleRateHz: 1000, values: [1] });
    const view = new DataView(bytes.buffer);
    expect([view.getUint8(0), view.getUint8(1), view.getUint8(2), view.getUint8(3)]).toEqual([0x54, 1, 0, 0]);
    expect(view.getUint32(4, true)).toBe(0x01020304);
    expect(view.getFloat64(8, true)).toBe(1);
    expect(view.getFloat64(16, true)).toBe(1000);
    expect(view.getUint16(24, true)).toBe(1);
    expect(view.getFloat32(28, true)).toBe(1);
  });

  it("names what is wrong with a bad payload", () => {
    const good = encodeBinarySamples({ seq: 1, t0: 0, sampleRateHz: 100, values: [1, 2] });
    const withNaN = good.slice();
    new DataView(withNaN.buffer).setFloat32(28, Number.NaN, true);
    const badVersion = good.slice();
    badVersion[1] = 2;
    const cases: Array<[Uint8Array | string, string]> = [
      [good.subarray(0, good.length - 1), "bad_length"],
      [good.subarray(0, 10), "bad_length"],
      [withNaN, "non_finite"],
      [badVersion, "bad_binary"],
      ["{nope", "bad_json"],
      ['{"seq":1,"t0":0,"sampleRateHz":100,"values":[]}', "bad_length"],
      ['{"seq":1,"t0":0,"sampleRateHz":100,"values":[1e999]}', "non_finite"],
      ['{"seq":-1,"t0":0,"sampleRateHz":100,"values":[1]}', "bad_shape"],
      ['{"seq":1,"t0":0,"sampleRateHz":100,"values":["1"]}', "bad_shape"],
      ['{"seq":1,"t0":0,"sampleRateHz":100,"values":[1],"extra":1}', "bad_shape"],
      [new Uint8Array(MAX_PAYLOAD_BYTES + 1), "oversized"],
    ];
    for (const [payload, fault] of cases) {
      const bytes = typeof payload === "string" ? new TextEncoder().encode(payload) : payload;
      expect(decodeSamples(bytes), String(payload).slice(0, 60)).toEqual({ ok: false, fault });
    }
  });

  it("refuses to encode more values than fit in a payload", () => {
    expect(() => encodeBinarySamples({ seq: 0, t0: 0, sampleRateHz: 1, values: new Float64Array(MAX_VALUES + 1) })).toThrow(/1 to/);
    expect(encodeBinarySamples({ seq: 0, t0: 0, sampleRateHz: 1, values: new Float64Array(MAX_VALUES) }).byteLength).toBeLessThanOrEqual(MAX_PAYLOAD_BYTES);
  });

  it("reads the JSON form", () => {
    const bytes = new TextEncoder().encode('{"seq":9,"t0":12.5,"sampleRateHz":1000,"values":[0.1,-2]}');
    expect(decodeSamples(bytes)).toEqual({ ok: true, batch: { seq: 9, t0: 12.5, sampleRateHz: 1000, values: Float64Array.from([0.1, -2]) } });
  });
});
