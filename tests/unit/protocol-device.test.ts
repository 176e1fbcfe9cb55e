import { describe, expect, it } from "vitest";
import {
  canonicalJson,
  channelConfigSchema,
  deviceAckSchema,
  deviceConfigSchema,
  MAX_CONFIG_SECTIONS,
  MAX_CONFIG_STAGES,
  MAX_CONFIG_TAPS,
  type UnsignedDeviceConfig,
} from "@/lib/protocol";
import { channelConfigChecksum, checksumMatches, configChecksum, signConfig } from "@/server/devices/checksum";

const q15: UnsignedDeviceConfig = {
  v: 3,
  device: "gearbox-endurance/torque-node",
  configId: "17",
  channels: {
    "input-torque": {
      revisionId: "rev-42",
      format: "q15",
      sampleRateHz: 1000,
      stages: [
        { kind: "sections", sections: [{ words: [1024, 2048, 1024, -20000, 9000], shift: 1 }] },
        { kind: "fir", taps: { words: [8192, 16384, 8192], shift: 0 } },
      ],
    },
    "shaft-speed": null,
  },
};

/** A channel entry as deployments stored it before chains (configuration v2), with the hash it was stored with. */
const legacyEntry = { revisionId: "rev-42", format: "q15" as const, sampleRateHz: 1000, sections: [{ words: [1024, 2048, 1024, -20000, 9000], shift: 1 }] };

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

describe("device configuration v3 checksum", () => {
  // Reference: Python 3.11.2 hashlib.sha256(json.dumps(c, sort_keys=True, separators=(",", ":"), ensure_ascii=False).encode()),
  // which writes the same text as canonicalJson for these integer, null and shortest-form float values.
  it("matches an independent SHA-256 over the same canonical text", () => {
    expect(canonicalJson(q15)).toBe(
      '{"channels":{"input-torque":{"format":"q15","revisionId":"rev-42","sampleRateHz":1000,"stages":[{"kind":"sections","sections":[{"shift":1,"words":[1024,2048,1024,-20000,9000]}]},{"kind":"fir","taps":{"shift":0,"words":[8192,16384,8192]}}]},"shaft-speed":null},"configId":"17","device":"gearbox-endurance/torque-node","v":3}',
    );
    expect(configChecksum(q15)).toBe("a48ba192561c4aed538b1c33fc24f7b935074019abe04ec015c82544d3a17ec6");
    const f32: UnsignedDeviceConfig = {
      v: 3,
      device: "hydraulic-press/env-node",
      configId: "restore-3",
      channels: {
        "frame-strain": {
          revisionId: "r1",
          format: "f32",
          sampleRateHz: 1000.5,
          stages: [
            { kind: "fir", taps: [0.25, 0.5, 0.25] },
            { kind: "sections", sections: [[0.1, 0.2, 0.1, 1, -1.5, 0.5625]] },
          ],
        },
        "ambient-temp": null,
      },
    };
    expect(configChecksum(f32)).toBe("8ea71aa901f38eaf1c1e572c14656b1057690295c1d0a6b52cba568f64583bf6");
    expect(channelConfigChecksum(q15.channels["input-torque"]!)).toBe("d9843ff402c97703eb940af63fabf863c03b72d62d5d9cccd333555f7166f63c");
    // An entry stored before chains keeps the hash it was stored with (the v2 reference value of this test).
    expect(channelConfigChecksum(legacyEntry)).toBe("05c876deacfa3ab5505764b9d85b2a42842f00a2a6067ef68217e3d376543287");
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

  it("refuses out-of-range words, a0 ≠ 1, bad keys, no channels, the v1 and v2 forms, too much filter and unknown fields", () => {
    const signed = signConfig(q15);
    const entry = q15.channels["input-torque"]!;
    const withEntry = (e: unknown) => ({ ...signed, channels: { "input-torque": e } });
    const sections = (list: unknown[]) => ({ ...entry, stages: [{ kind: "sections", sections: list }] });
    const taps = (words: number[]) => ({ ...entry, stages: [{ kind: "fir", taps: { words, shift: 0 } }] });
    expect(deviceConfigSchema.safeParse(withEntry(sections([{ words: [40000, 0, 0, 0, 0], shift: 0 }]))).success).toBe(false);
    expect(deviceConfigSchema.safeParse(withEntry({ ...entry, format: "f32", stages: [{ kind: "sections", sections: [[1, 0, 0, 2, 0, 0]] }] })).success).toBe(false);
    expect(deviceConfigSchema.safeParse(withEntry(taps([1, 40000]))).success).toBe(false);
    expect(deviceConfigSchema.safeParse(withEntry(taps([]))).success).toBe(false);
    expect(deviceConfigSchema.safeParse(withEntry(sections([]))).success).toBe(false);
    expect(deviceConfigSchema.safeParse(withEntry({ ...entry, stages: [] })).success).toBe(true); // a unit filter
    const section = { words: [1024, 0, 0, 0, 0], shift: 0 };
    const manySections = { ...entry, stages: [0, 1].map(() => ({ kind: "sections", sections: new Array(MAX_CONFIG_SECTIONS / 2 + 1).fill(section) })) };
    expect(deviceConfigSchema.safeParse(withEntry(manySections)).error?.issues[0].message).toBe(`a channel runs at most ${MAX_CONFIG_SECTIONS} sections (got ${MAX_CONFIG_SECTIONS + 2})`);
    const manyTaps = { ...entry, stages: [0, 1].map(() => ({ kind: "fir", taps: { words: new Array(MAX_CONFIG_TAPS / 2 + 1).fill(1), shift: 0 } })) };
    expect(deviceConfigSchema.safeParse(withEntry(manyTaps)).error?.issues[0].message).toBe(`a channel runs at most ${MAX_CONFIG_TAPS} FIR taps (got ${MAX_CONFIG_TAPS + 2})`);
    expect(deviceConfigSchema.safeParse(withEntry({ ...entry, stages: new Array(MAX_CONFIG_STAGES + 1).fill(entry.stages[1]) })).success).toBe(false);
    expect(deviceConfigSchema.safeParse({ ...signed, v: 2, channels: { "input-torque": legacyEntry } }).success).toBe(false);
    expect(deviceConfigSchema.safeParse(withEntry(legacyEntry)).success).toBe(false);
    expect(deviceConfigSchema.safeParse(withEntry({ ...entry, channel: "input-torque" })).success).toBe(false);
    expect(deviceConfigSchema.safeParse({ ...signed, channels: { "Input Torque": null } }).success).toBe(false);
    expect(deviceConfigSchema.safeParse({ ...signed, channels: {} }).success).toBe(false);
    expect(deviceConfigSchema.safeParse({ ...signed, device: "torque-node" }).success).toBe(false);
    expect(deviceConfigSchema.safeParse({ ...signed, extra: true }).success).toBe(false);
    expect(deviceConfigSchema.safeParse({ v: 1, channel: "input-torque", ...entry, checksum: signed.checksum }).success).toBe(false);
    expect(channelConfigSchema.safeParse(entry).success).toBe(true);
  });

  it("acks name the configId and checksum and carry the document's version; the v1 and v2 ack forms are gone", () => {
    const signed = signConfig(q15);
    expect(deviceAckSchema.safeParse({ v: 3, configId: "17", checksum: signed.checksum, status: "applied" }).success).toBe(true);
    expect(deviceAckSchema.safeParse({ v: 3, configId: "17", checksum: signed.checksum, status: "refused", reason: "checksum mismatch" }).success).toBe(true);
    expect(deviceAckSchema.safeParse({ v: 3, configId: "17", checksum: "abc", status: "applied" }).success).toBe(false);
    expect(deviceAckSchema.safeParse({ v: 2, configId: "17", checksum: signed.checksum, status: "applied" }).success).toBe(false);
    expect(deviceAckSchema.safeParse({ v: 1, revisionId: "r", checksum: signed.checksum, status: "applied" }).success).toBe(false);
  });
});
