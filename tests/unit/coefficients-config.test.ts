import { describe, expect, it } from "vitest";
import {
  buildRevisionContent, configChecksum, DeploymentRefusal, MAX_DEVICE_SECTIONS, quantizeForTarget, sectionsDesign,
  signDeviceConfig, unsignedDeviceConfig, type DeploymentTarget,
} from "@/lib/coefficients";
import { designFilter, frequencyResponse, type FilterSpec } from "@/lib/dsp";
import { DEMO_RIGS } from "@/lib/demo/lab";
import { deviceConfigSchema } from "@/lib/protocol";
import { answerConfig } from "@/server/demo-rig/config-handler";
import { configChecksum as nodeChecksum } from "@/server/devices/checksum";

const butter: FilterSpec = { kind: "iir", family: "butterworth", response: "lowpass", order: 4, cutoffHz: 100, sampleRateHz: 1000 };
const torqueNode = DEMO_RIGS[0].devices[0]; // q15, input-torque at 1 kHz
const target = (format: DeploymentTarget["format"]): DeploymentTarget => ({ channelKey: "input-torque", sampleRateHz: 1000, format });

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

describe("device config", () => {
  it.each(["f32", "q15", "q31"] as const)("builds a schema-valid %s config whose checksum matches the sidecar's", async (format) => {
    const design = designFilter(butter);
    const config = await signDeviceConfig(unsignedDeviceConfig("42", target(format), quantizeForTarget(design, target(format))));
    expect(deviceConfigSchema.parse(config)).toEqual(config);
    expect(config.sections).toHaveLength(2);
    expect(config.checksum).toBe(nodeChecksum(config));
    expect(await configChecksum(config)).toBe(config.checksum);
  });

  it("is accepted by the demo device for its own format and refused when a byte changes", async () => {
    const design = designFilter(butter);
    const config = await signDeviceConfig(unsignedDeviceConfig("7", target("q15"), quantizeForTarget(design, target("q15"))));
    expect(answerConfig(torqueNode, Buffer.from(JSON.stringify(config)))).toMatchObject({ status: "applied", revisionId: "7" });
    if (config.format !== "q15") throw new Error("expected q15");
    const tampered = { ...config, sections: config.sections.map((s, i) => (i === 0 ? { ...s, shift: s.shift + 1 } : s)) };
    expect(answerConfig(torqueNode, Buffer.from(JSON.stringify(tampered)))).toMatchObject({ status: "refused", reason: "checksum mismatch" });
  });

  it("writes Q15 words that reproduce the quantized coefficients (word · 2^(shift − 15))", () => {
    const q = quantizeForTarget(designFilter(butter), target("q15"));
    const config = unsignedDeviceConfig("1", target("q15"), q);
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
