import { describe, expect, it } from "vitest";
import { canonicalJson, channelConfigSchema, deviceAckSchema, deviceConfigSchema, type UnsignedDeviceConfig } from "@/lib/protocol";
import { channelConfigChecksum, checksumMatches, configChecksum, signConfig } from "@/server/devices/checksum";

const q15: UnsignedDeviceConfig = {
  v: 2,
  device: "gearbox-endurance/torque-node",
  configId: "17",
  channels: {
    "input-torque": { revisionId: "rev-42", format: "q15", sampleRateHz: 1000, sections: [{ words: [1024, 2048, 1024, -20000, 9000], shift: 1 }] },
    "shaft-speed": null,
  },
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

describe("device configuration v2 checksum", () => {
  // Reference: Python 3.11.2 hashlib.sha256(json.dumps(c, sort_keys=True, separators=(",", ":"), ensure_ascii=False).encode()),
  // which writes the same text as canonicalJson for these integer, null and shortest-form float values.
  it("matches an independent SHA-256 over the same canonical text", () => {
    expect(canonicalJson(q15)).toBe(
      '{"channels":{"input-torque":{"format":"q15","revisionId":"rev-42","sampleRateHz":1000,"sections":[{"shift":1,"words":[1024,2048,1024,-20000,9000]}]},"shaft-speed":null},"configId":"17","device":"gearbox-endurance/torque-node","v":2}',
    );
    expect(configChecksum(q15)).toBe("0685ea453bec39d05f42bd3ba60da81a1daca91f3e240cec38433e65f44bf75d");
    const f32: UnsignedDeviceConfig = {
      v: 2,
      device: "hydraulic-press/env-node",
      configId: "restore-3",
      channels: {
        "frame-strain": { revisionId: "r1", format: "f32", sampleRateHz: 1000.5, sections: [[0.1, 0.2, 0.1, 1, -1.5, 0.5625]] },
        "ambient-temp": null,
      },
    };
    expect(configChecksum(f32)).toBe("199a4d683a059548b7e20706e8e5612440eb65b9b26b9603483247a87c6d6517");
    expect(channelConfigChecksum(q15.channels["input-torque"]!)).toBe("05c876deacfa3ab5505764b9d85b2a42842f00a2a6067ef68217e3d376543287");
  });

  it("signs, validates and detects tampering anywhere in the document; the checksum field itself is not hashed", () => {
    const signed = signConfig(q15);
    expect(deviceConfigSchema.parse(signed)).toEqual(signed);
    expect(checksumMatches(signed)).toBe(true);
    expect(configChecksum(signed)).toBe(signed.checksum);
    expect(checksumMatches({ ...signed, configId: "18" })).toBe(false);
    expect(checksumMatches({ ...signed, channels: { ...signed.channels, "shaft-speed": signed.channels["input-torque"] } })).toBe(false);
    const { "shaft-speed": _dropped, ...oneChannel } = signed.channels;
    expect(checksumMatches({ ...signed, channels: oneChannel })).toBe(false);
  });

  it("refuses out-of-range words, a0 ≠ 1, bad keys, no channels, the v1 single-channel form and unknown fields", () => {
    const signed = signConfig(q15);
    const entry = q15.channels["input-torque"]!;
    const withEntry = (e: unknown) => ({ ...signed, channels: { "input-torque": e } });
    expect(deviceConfigSchema.safeParse(withEntry({ ...entry, sections: [{ words: [40000, 0, 0, 0, 0], shift: 0 }] })).success).toBe(false);
    expect(deviceConfigSchema.safeParse(withEntry({ ...entry, format: "f32", sections: [[1, 0, 0, 2, 0, 0]] })).success).toBe(false);
    expect(deviceConfigSchema.safeParse(withEntry({ ...entry, channel: "input-torque" })).success).toBe(false);
    expect(deviceConfigSchema.safeParse({ ...signed, channels: { "Input Torque": null } }).success).toBe(false);
    expect(deviceConfigSchema.safeParse({ ...signed, channels: {} }).success).toBe(false);
    expect(deviceConfigSchema.safeParse({ ...signed, device: "torque-node" }).success).toBe(false);
    expect(deviceConfigSchema.safeParse({ ...signed, extra: true }).success).toBe(false);
    expect(deviceConfigSchema.safeParse({ v: 1, channel: "input-torque", ...entry, checksum: signed.checksum }).success).toBe(false);
    expect(channelConfigSchema.safeParse(entry).success).toBe(true);
  });

  it("acks name the configId and checksum; the v1 ack form is gone", () => {
    const signed = signConfig(q15);
    expect(deviceAckSchema.safeParse({ v: 2, configId: "17", checksum: signed.checksum, status: "applied" }).success).toBe(true);
    expect(deviceAckSchema.safeParse({ v: 2, configId: "17", checksum: signed.checksum, status: "refused", reason: "checksum mismatch" }).success).toBe(true);
    expect(deviceAckSchema.safeParse({ v: 2, configId: "17", checksum: "abc", status: "applied" }).success).toBe(false);
    expect(deviceAckSchema.safeParse({ v: 1, revisionId: "r", checksum: signed.checksum, status: "applied" }).success).toBe(false);
  });
});
