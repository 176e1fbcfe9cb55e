import { describe, expect, it } from "vitest";
import { canonicalJson, deviceAckSchema, deviceConfigSchema, type UnsignedDeviceConfig } from "@/lib/protocol";
import { checksumMatches, configChecksum, signConfig } from "@/server/devices/checksum";

const q15: UnsignedDeviceConfig = {
  v: 1,
  revisionId: "rev-42",
  channel: "input-torque",
  format: "q15",
  sampleRateHz: 1000,
  sections: [{ words: [1024, 2048, 1024, -20000, 9000], shift: 1 }],
};

describe("canonical JSON (RFC 8785 rules)", () => {
  it("sorts keys at every level, drops undefined and writes no whitespace", () => {
    expect(canonicalJson({ b: 1, a: { d: [3, { z: 1, y: undefined, x: "é" }], c: null } })).toBe('{"a":{"c":null,"d":[3,{"x":"é","z":1}]},"b":1}');
  });

  it("writes numbers in ECMAScript shortest round-trip form", () => {
    expect(canonicalJson([1, 1.5, 0.1, 1e21, -0, 5e-324])).toBe("[1,1.5,0.1,1e+21,0,5e-324]");
  });

  it("refuses what JSON cannot carry", () => {
    expect(() => canonicalJson({ a: Number.NaN })).toThrow(/cannot hold/);
    expect(() => canonicalJson({ a: 1n })).toThrow(/bigint/);
  });
});

describe("config checksum", () => {
  // Reference: Python 3.11.2 hashlib.sha256(json.dumps(c, sort_keys=True, separators=(",", ":"), ensure_ascii=False).encode()),
  // which writes the same text as canonicalJson for these integer and shortest-form float values.
  it("matches an independent SHA-256 over the same canonical text", () => {
    expect(canonicalJson(q15)).toBe(
      '{"channel":"input-torque","format":"q15","revisionId":"rev-42","sampleRateHz":1000,"sections":[{"shift":1,"words":[1024,2048,1024,-20000,9000]}],"v":1}',
    );
    expect(configChecksum(q15)).toBe("57df9e81d2f68d4e6cce0ee935a4c2f213840ded77443a8a5d2676a8e2d2d128");
    const f32: UnsignedDeviceConfig = {
      v: 1,
      revisionId: "r1",
      channel: "frame-strain",
      format: "f32",
      sampleRateHz: 1000.5,
      sections: [[0.1, 0.2, 0.1, 1, -1.5, 0.5625]],
    };
    expect(configChecksum(f32)).toBe("fdaa98467feb77a7f733b68bed7cbe296a18fb9c33461ec6adf63c496e47676b");
  });

  it("signs, validates and detects tampering; the checksum field itself is not hashed", () => {
    const signed = signConfig(q15);
    expect(deviceConfigSchema.parse(signed)).toEqual(signed);
    expect(checksumMatches(signed)).toBe(true);
    expect(configChecksum(signed)).toBe(signed.checksum);
    expect(checksumMatches({ ...signed, revisionId: "rev-43" })).toBe(false);
  });

  it("refuses out-of-range words, a0 ≠ 1 and unknown fields", () => {
    const signed = signConfig(q15);
    expect(deviceConfigSchema.safeParse({ ...signed, sections: [{ words: [40000, 0, 0, 0, 0], shift: 0 }] }).success).toBe(false);
    expect(deviceConfigSchema.safeParse({ ...signed, format: "f32", sections: [[1, 0, 0, 2, 0, 0]] }).success).toBe(false);
    expect(deviceConfigSchema.safeParse({ ...signed, extra: true }).success).toBe(false);
    expect(deviceAckSchema.safeParse({ v: 1, revisionId: "r", checksum: signed.checksum, status: "applied" }).success).toBe(true);
    expect(deviceAckSchema.safeParse({ v: 1, revisionId: "r", checksum: "abc", status: "applied" }).success).toBe(false);
  });
});
