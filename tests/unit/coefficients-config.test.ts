import { describe, expect, it } from "vitest";
import {
  buildRevisionContent, channelConfigChecksum, channelConfigEntry, DeploymentRefusal, MAX_DEVICE_SECTIONS, quantizeForTarget,
  sectionsDesign, type DeploymentTarget,
} from "@/lib/coefficients";
import { designFilter, frequencyResponse, type FilterSpec } from "@/lib/dsp";
import { DEMO_RIGS } from "@/lib/demo/lab";
import { channelConfigSchema, deviceConfigSchema, type ChannelConfig, type DeviceConfig } from "@/lib/protocol";
import { answerConfig } from "@/server/demo-rig/config-handler";
import { channelConfigChecksum as nodeChannelChecksum, signConfig } from "@/server/devices/checksum";

const butter: FilterSpec = { kind: "iir", family: "butterworth", response: "lowpass", order: 4, cutoffHz: 100, sampleRateHz: 1000 };
const torqueNode = DEMO_RIGS[0].devices[0]; // q15, input-torque at 1 kHz
const target = (format: DeploymentTarget["format"]): DeploymentTarget => ({ channelKey: "input-torque", sampleRateHz: 1000, format });
/** The torque node's whole document with `entry` on input-torque and shaft-speed pass-through. */
const torqueDocument = (entry: ChannelConfig): DeviceConfig =>
  signConfig({ v: 2, device: "gearbox-endurance/torque-node", configId: "7", channels: { "input-torque": entry, "shaft-speed": null } });
const answer = (doc: unknown) => answerConfig("gearbox-endurance", torqueNode, Buffer.from(JSON.stringify(doc)));

describe("revision content", () => {
  it("stores the design, its analysis and the quantized sections for the device format", () => {
    const c = buildRevisionContent(butter, "q15");
    expect(c.design.sos).toHaveLength(2);
    expect(c.quantized?.format).toBe("q15");
    expect(c.quantized?.integers).toHaveLength(2);
    expect(c.analysis.stable).toBe(true);
    expect(c.analysis.cutoffsHz[0]).toBeCloseTo(100, 6); // −3.0103 dB at fc, field notes §2.1
    // Analog Butterworth N=4 DC delay 2.6131/ωc s (field notes §2.1); the digital design is close to it at fc = fs/10.
    expect(c.analysis.groupDelayDcMs).toBeGreaterThan(((2.6131 / (2 * Math.PI * 100)) * 1000) * 0.9);
    expect(c.analysis.step.overshootPercent).toBeGreaterThan(5);
    expect(c.analysis.deployable).toEqual({ ok: true });
    expect(JSON.parse(JSON.stringify(c))).toEqual(c); // stored as JSON without loss
  });

  it("marks an unstable design as not deployable and keeps no frequency-domain numbers for it", () => {
    const c = buildRevisionContent({ kind: "coefficients", b: [1], a: [1, 0, 1.21], sampleRateHz: 1000 }, "f32");
    expect(c.analysis.stable).toBe(false);
    expect(c.analysis.groupDelayDcSamples).toBeNull();
    expect(c.analysis.deployable).toMatchObject({ ok: false, reason: expect.stringMatching(/unstable/) });
  });

  it("marks a design whose Q15 numerator rounds to zero as not deployable (butter(2, 1 Hz, fs = 1 kHz), field notes §1.5)", () => {
    const c = buildRevisionContent({ ...butter, order: 2, cutoffHz: 1 }, "q15");
    expect(c.analysis.stable).toBe(true);
    expect(c.analysis.deployable).toMatchObject({ ok: false, reason: expect.stringMatching(/all-zero numerator/) });
    expect(buildRevisionContent({ ...butter, order: 2, cutoffHz: 1 }, "q31").analysis.deployable).toEqual({ ok: true });
  });
});

describe("sections form", () => {
  it("factors an FIR into second-order sections with the same response", () => {
    const fir = designFilter({ kind: "moving-average", length: 5, sampleRateHz: 1000 });
    const sos = sectionsDesign(fir);
    expect(sos.sos).toHaveLength(2);
    const freqs = [0, 50, 123, 321, 499];
    const a = frequencyResponse(fir, freqs).magnitudeDb;
    const b = frequencyResponse(sos, freqs).magnitudeDb;
    a.forEach((v, i) => expect(b[i]).toBeCloseTo(v, 6));
  });

  it(`refuses designs that need more than ${MAX_DEVICE_SECTIONS} sections`, () => {
    const fir = designFilter({ kind: "moving-average", length: 2 * MAX_DEVICE_SECTIONS + 2, sampleRateHz: 1000 });
    expect(() => sectionsDesign(fir)).toThrow(/at most 64/);
  });
});

describe("device config entry", () => {
  it.each(["f32", "q15", "q31"] as const)("builds a schema-valid %s entry whose Web Crypto checksum matches the sidecar's", async (format) => {
    const design = designFilter(butter);
    const entry = channelConfigEntry("42", target(format), quantizeForTarget(design, target(format)));
    expect(channelConfigSchema.parse(entry)).toEqual(entry);
    expect(entry.sections).toHaveLength(2);
    expect(await channelConfigChecksum(entry)).toBe(nodeChannelChecksum(entry));
    expect(await channelConfigChecksum(entry)).toMatch(/^[0-9a-f]{64}$/);
  });

  it("goes into a document the demo device applies whole, and refuses when a byte changes", () => {
    const entry = channelConfigEntry("7", target("q15"), quantizeForTarget(designFilter(butter), target("q15")));
    const doc = torqueDocument(entry);
    expect(deviceConfigSchema.parse(doc)).toEqual(doc);
    expect(answer(doc)).toEqual({ v: 2, configId: "7", checksum: doc.checksum, status: "applied" });
    if (entry.format !== "q15") throw new Error("expected q15");
    const tampered = { ...entry, sections: entry.sections.map((s, i) => (i === 0 ? { ...s, shift: s.shift + 1 } : s)) };
    expect(answer({ ...doc, channels: { ...doc.channels, "input-torque": tampered } })).toMatchObject({
      configId: "7",
      checksum: doc.checksum,
      status: "refused",
      reason: "checksum mismatch",
    });
  });

  it("is refused whole by the demo device for any wrong channel: format, sample rate, unknown or missing channel, other device", () => {
    const entry = channelConfigEntry("7", target("q15"), quantizeForTarget(designFilter(butter), target("q15")));
    const f32 = channelConfigEntry("8", target("f32"), quantizeForTarget(designFilter(butter), target("f32")));
    const reasons = [
      torqueDocument(f32),
      signConfig({ v: 2, device: "gearbox-endurance/torque-node", configId: "7", channels: { "input-torque": entry, "shaft-speed": entry } }),
      signConfig({ v: 2, device: "gearbox-endurance/torque-node", configId: "7", channels: { "input-torque": entry, "shaft-speed": null, spare: null } }),
      signConfig({ v: 2, device: "gearbox-endurance/torque-node", configId: "7", channels: { "input-torque": entry } }),
      signConfig({ v: 2, device: "hydraulic-press/torque-node", configId: "7", channels: { "input-torque": entry, "shaft-speed": null } }),
    ].map((doc) => answer(doc));
    expect(reasons.map((a) => a?.status)).toEqual(["refused", "refused", "refused", "refused", "refused"]);
    expect(reasons.map((a) => a?.reason)).toEqual([
      "input-torque: this device runs q15, not f32",
      "shaft-speed: channel runs at 500 Hz",
      "no channel spare on this device",
      "no entry for channel shaft-speed",
      "addressed to hydraulic-press/torque-node, not this device",
    ]);
  });

  it("answers a malformed document that names a configId and checksum, and ignores one that does not", () => {
    const doc = torqueDocument(channelConfigEntry("7", target("q15"), quantizeForTarget(designFilter(butter), target("q15"))));
    expect(answer({ ...doc, v: 1 })).toMatchObject({ configId: "7", status: "refused", reason: "malformed config" });
    expect(answer({ v: 2, channels: {} })).toBeNull();
    expect(answerConfig("gearbox-endurance", torqueNode, Buffer.from(""))).toBeNull();
  });

  it("writes Q15 words that reproduce the quantized coefficients (word · 2^(shift − 15))", () => {
    const q = quantizeForTarget(designFilter(butter), target("q15"));
    const config = channelConfigEntry("1", target("q15"), q);
    if (config.format !== "q15") throw new Error("expected q15");
    config.sections.forEach((s, i) => {
      const [b0, b1, b2, a1, a2] = s.words.map((w) => w * 2 ** (s.shift - 15));
      const row = q.sos![i];
      expect([b0, b1, b2, a1, a2]).toEqual([row[0], row[1], row[2], row[4], row[5]]);
    });
  });

  it("refuses a sample-rate mismatch and an unstable design with the reason", () => {
    const design = designFilter(butter);
    expect(() => quantizeForTarget(design, { ...target("q15"), sampleRateHz: 2000 })).toThrow(DeploymentRefusal);
    expect(() => quantizeForTarget(design, { ...target("q15"), sampleRateHz: 2000 })).toThrow(/sample-rate mismatch: .* 1000 Hz, .* 2000 Hz/);
    const unstable = designFilter({ kind: "coefficients", b: [1], a: [1, 0, 1.21], sampleRateHz: 1000 });
    expect(() => quantizeForTarget(unstable, target("f32"))).toThrow(/unstable/);
  });
});
