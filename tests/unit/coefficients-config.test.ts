import { describe, expect, it } from "vitest";
import {
  buildRevisionContent,
  channelConfigChecksum,
  channelConfigEntry,
  currentChannelConfig,
  DeploymentRefusal,
  entryDesign,
  quantizeForTarget,
  type DeploymentTarget,
  type StoredCoefficients,
} from "@/lib/coefficients";
import { designFilter, quantizeDesign, quantizedParts, type FilterSpec, type QuantFormat } from "@/lib/dsp";
import { DEMO_RIGS } from "@/lib/demo/lab";
import { channelConfigSchema, deviceConfigSchema, type ChannelConfig, type DeviceConfig } from "@/lib/protocol";
import { answerConfig } from "@/server/demo-rig/config-handler";
import { channelConfigChecksum as nodeChannelChecksum, signConfig } from "@/server/devices/checksum";
import { firLowpass255, humChain, legacyFirRevision } from "./coefficients-support";

const butter: FilterSpec = { kind: "iir", family: "butterworth", response: "lowpass", order: 4, cutoffHz: 100, sampleRateHz: 1000 };
const torqueNode = DEMO_RIGS[0].devices[0]; // q15, input-torque at 1 kHz (16 sections, 256 taps)
const target = (format: DeploymentTarget["format"], capacity = { maxSections: 16, maxFirTaps: 256 }): DeploymentTarget => ({
  label: "torque-node/input-torque",
  sampleRateHz: 1000,
  format,
  capacity,
});
/** A revision as stored when saved for `format` (buildRevisionContent). */
const saved = (spec: FilterSpec, format: QuantFormat): StoredCoefficients => {
  const c = buildRevisionContent(spec, format);
  return { design: c.design, format, quantized: c.quantized };
};
const entryFor = (spec: FilterSpec, format: DeploymentTarget["format"], id = "7") =>
  channelConfigEntry(id, target(format), quantizeForTarget(saved(spec, format), target(format)));
/** The torque node's whole document with `entry` on input-torque and shaft-speed pass-through. */
const torqueDocument = (entry: ChannelConfig): DeviceConfig =>
  signConfig({ v: 3, device: "gearbox-endurance/torque-node", configId: "7", channels: { "input-torque": entry, "shaft-speed": null } });
const answer = (doc: unknown) => answerConfig("gearbox-endurance", torqueNode, Buffer.from(JSON.stringify(doc)));

describe("revision content", () => {
  it("stores the design, its analysis and the quantized sections for the device format", () => {
    const c = buildRevisionContent(butter, "q15");
    expect(c.design.sos).toHaveLength(2);
    expect(c.quantized?.format).toBe("q15");
    expect(c.quantized?.integers).toHaveLength(2);
    expect(c.analysis.stable).toBe(true);
    expect(c.analysis.cutoffsHz[0]).toBeCloseTo(100, 6); // −3.0103 dB at fc: |H(jωc)|² = 1/2 (Butterworth 1930)
    // Analog Butterworth N=4 DC delay 1/(ωc·sin(π/8)) = 2.6131/ωc s (from the pole positions, Σ −Re(p_k)/|p_k|²;
    // common practice); the digital design is close to it at fc = fs/10.
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

  it("marks a design whose Q15 numerator rounds to zero as not deployable (scipy butter(2, 1 Hz, fs = 1 kHz): b0 = 9.8e-6, below half a Q15 step 2^−16)", () => {
    const c = buildRevisionContent({ ...butter, order: 2, cutoffHz: 1 }, "q15");
    expect(c.analysis.stable).toBe(true);
    expect(c.analysis.deployable).toMatchObject({ ok: false, reason: expect.stringMatching(/all-zero numerator/) });
    expect(buildRevisionContent({ ...butter, order: 2, cutoffHz: 1 }, "q31").analysis.deployable).toEqual({ ok: true });
  });

  it("stores a chain: its spec's stages as the design's stages, quantized stage by stage with headroom, and the whole chain's analysis", () => {
    const c = buildRevisionContent(humChain, "q15");
    expect(c.design.stages?.map((s) => [s.stage, s.sos?.length])).toEqual([[0, 1], [1, 1], [2, 2]]);
    expect(c.quantized?.stages?.map((s) => [s.stage, s.integers?.length, s.shifts.length])).toEqual([[0, 1, 1], [1, 1, 1], [2, 2, 2]]);
    expect(c.quantized?.headroom).toHaveLength(3);
    expect(c.analysis).toMatchObject({ stable: true, deployable: { ok: true } });
    // The chain's −3 dB point sits below the low-pass's 200 Hz: the notches' skirts take their share (the product of the stages' responses).
    const lowpassOnly = buildRevisionContent((humChain as Extract<FilterSpec, { kind: "chain" }>).stages[2] as FilterSpec, "q15");
    expect(Math.max(...c.analysis.cutoffsHz)).toBeLessThanOrEqual(Math.max(...lowpassOnly.analysis.cutoffsHz));
    expect(c.analysis.groupDelayDcSamples).toBeGreaterThan(lowpassOnly.analysis.groupDelayDcSamples!);
    expect(JSON.parse(JSON.stringify(c))).toEqual(c);
  });

  it("keeps an FIR as taps, never converted to sections: a 255-tap low-pass is 255 tap words with one post-shift", () => {
    const c = buildRevisionContent(firLowpass255, "q15");
    expect(c.design.taps).toHaveLength(255);
    expect(c.quantized?.sos).toBeUndefined();
    expect(c.quantized?.integers?.[0]).toHaveLength(255);
    expect(c.quantized?.shifts).toHaveLength(1);
    expect(c.analysis.deployable).toEqual({ ok: true });
  });
});

describe("device config entry", () => {
  it.each(["f32", "q15", "q31"] as const)("builds a schema-valid %s entry whose Web Crypto checksum matches the sidecar's", async (format) => {
    const entry = entryFor(butter, format, "42");
    expect(channelConfigSchema.parse(entry)).toEqual(entry);
    expect(entry.stages).toHaveLength(1);
    expect(entry.stages[0]).toMatchObject({ kind: "sections", sections: { length: 2 } });
    expect(await channelConfigChecksum(entry)).toBe(nodeChannelChecksum(entry));
    expect(await channelConfigChecksum(entry)).toMatch(/^[0-9a-f]{64}$/);
  });

  it.each(["f32", "q15", "q31"] as const)("carries a chain stage by stage in %s: sections stages and an FIR stage as taps", (format) => {
    const chain: FilterSpec = { kind: "chain", sampleRateHz: 1000, stages: [{ ...firLowpass255, taps: 31 }, ...(humChain.kind === "chain" ? humChain.stages.slice(0, 2) : [])] };
    const q = quantizeForTarget(saved(chain, format), target(format));
    const entry = channelConfigEntry("9", target(format), q);
    expect(channelConfigSchema.parse(entry)).toEqual(entry);
    expect(entry.stages.map((s) => s.kind)).toEqual(["fir", "sections", "sections"]);
    const fir = entry.stages[0];
    if (fir.kind !== "fir") throw new Error("expected an FIR stage");
    if (Array.isArray(fir.taps)) expect(fir.taps).toEqual(q.stages?.[0].taps);
    else expect(fir.taps).toEqual({ words: q.stages?.[0].integers?.[0], shift: q.stages?.[0].shifts[0] });
  });

  it("goes into a document the demo device applies whole, and refuses when a byte changes", () => {
    const entry = entryFor(humChain, "q15");
    const doc = torqueDocument(entry);
    expect(deviceConfigSchema.parse(doc)).toEqual(doc);
    expect(answer(doc)).toEqual({ v: 3, configId: "7", checksum: doc.checksum, status: "applied" });
    if (entry.format !== "q15" || entry.stages[2].kind !== "sections") throw new Error("expected q15 sections");
    const last = entry.stages[2];
    const tampered = { ...entry, stages: [...entry.stages.slice(0, 2), { ...last, sections: last.sections.map((s, i) => (i === 0 ? { ...s, shift: s.shift + 1 } : s)) }] };
    expect(answer({ ...doc, channels: { ...doc.channels, "input-torque": tampered } })).toMatchObject({
      configId: "7",
      checksum: doc.checksum,
      status: "refused",
      reason: "checksum mismatch",
    });
  });

  it("is refused whole by the demo device for any wrong channel: format, sample rate, capacity, unknown or missing channel, other device", () => {
    const entry = entryFor(butter, "q15");
    const f32 = entryFor(butter, "f32", "8");
    const tooBig = channelConfigEntry("10", target("q15"), quantizeDesign(designFilter(firLowpass255), "q15")); // 255 taps on a 256-tap channel …
    const twoFirs = { ...tooBig, stages: [...tooBig.stages, ...tooBig.stages] } as ChannelConfig; // … but not 510
    const reasons = [
      torqueDocument(f32),
      signConfig({ v: 3, device: "gearbox-endurance/torque-node", configId: "7", channels: { "input-torque": entry, "shaft-speed": entry } }),
      torqueDocument(twoFirs),
      signConfig({ v: 3, device: "gearbox-endurance/torque-node", configId: "7", channels: { "input-torque": entry, "shaft-speed": null, spare: null } }),
      signConfig({ v: 3, device: "gearbox-endurance/torque-node", configId: "7", channels: { "input-torque": entry } }),
      signConfig({ v: 3, device: "hydraulic-press/torque-node", configId: "7", channels: { "input-torque": entry, "shaft-speed": null } }),
    ].map((doc) => answer(doc));
    expect(answer(torqueDocument(tooBig))?.status).toBe("applied");
    expect(reasons.map((a) => a?.status)).toEqual(["refused", "refused", "refused", "refused", "refused", "refused"]);
    expect(reasons.map((a) => a?.reason)).toEqual([
      "input-torque: this device runs q15, not f32",
      "shaft-speed: channel runs at 500 Hz",
      "input-torque: 0 sections and 510 taps exceed this channel's 16 sections and 256 taps",
      "no channel spare on this device",
      "no entry for channel shaft-speed",
      "addressed to hydraulic-press/torque-node, not this device",
    ]);
  });

  it("answers a malformed document that names a configId and checksum (a v2 document too), and ignores one that does not", () => {
    const doc = torqueDocument(entryFor(butter, "q15"));
    expect(answer({ ...doc, v: 2 })).toEqual({ v: 3, configId: "7", checksum: doc.checksum, status: "refused", reason: "malformed config" });
    expect(answer({ v: 3, channels: {} })).toBeNull();
    expect(answerConfig("gearbox-endurance", torqueNode, Buffer.from(""))).toBeNull();
  });

  it("writes Q15 words that reproduce the quantized coefficients (word · 2^(shift − 15)), and entryDesign runs exactly those", () => {
    const q = quantizeForTarget(saved(humChain, "q15"), target("q15"));
    const config = channelConfigEntry("1", target("q15"), q);
    if (config.format !== "q15") throw new Error("expected q15");
    config.stages.forEach((stage, k) => {
      if (stage.kind !== "sections") throw new Error("expected sections");
      stage.sections.forEach((s, i) => {
        const [b0, b1, b2, a1, a2] = s.words.map((w) => w * 2 ** (s.shift - 15));
        const row = quantizedParts(q)[k].sos![i];
        expect([b0, b1, b2, a1, a2]).toEqual([row[0], row[1], row[2], row[4], row[5]]);
      });
    });
    const running = entryDesign(config, designFilter(humChain));
    expect(running?.stages?.map((s) => s.sos)).toEqual(quantizedParts(q).map((p) => p.sos));
  });

  it("entryDesign gives one design for one stage (taps at their real values) and nothing for a unit filter", () => {
    const design = designFilter(firLowpass255);
    const q = quantizeDesign(design, "q31");
    const entry = channelConfigEntry("3", target("q31"), q);
    expect(entryDesign(entry, design)).toMatchObject({ sampleRateHz: 1000, taps: q.taps, zeros: design.zeros, gain: design.gain });
    expect(entryDesign(entry, design)?.stages).toBeUndefined();
    expect(entryDesign({ ...entry, stages: [] }, design)).toBeNull();
    expect(() => entryDesign(entry, designFilter(humChain))).toThrow("the entry of revision 3 has 1 stages but its design has 3");
  });
});

describe("promotion checks (quantizeForTarget)", () => {
  it("refuses a sample-rate mismatch and an unstable design with the reason", () => {
    const rev = saved(butter, "q15");
    expect(() => quantizeForTarget(rev, { ...target("q15"), sampleRateHz: 2000 })).toThrow(DeploymentRefusal);
    expect(() => quantizeForTarget(rev, { ...target("q15"), sampleRateHz: 2000 })).toThrow(
      "sample-rate mismatch: the revision is designed for 1000 Hz, torque-node/input-torque samples at 2000 Hz",
    );
    const unstable = saved({ kind: "coefficients", b: [1], a: [1, 0, 1.21], sampleRateHz: 1000 }, "f32");
    expect(() => quantizeForTarget(unstable, target("f32"))).toThrow(/unstable/);
  });

  it("refuses a filter that does not fit the channel, with both sets of numbers", () => {
    const chain: FilterSpec = {
      kind: "chain",
      sampleRateHz: 1000,
      stages: [humChain.kind === "chain" ? humChain.stages[0] : butter, { ...butter, order: 12 }, firLowpass255],
    };
    const small = { ...target("q31", { maxSections: 4, maxFirTaps: 128 }), label: "press-ctl/ram-position" };
    expect(() => quantizeForTarget(saved(chain, "q31"), small)).toThrow(
      new DeploymentRefusal("the filter needs 7 sections and 255 FIR taps; press-ctl/ram-position takes at most 4 sections and 128 FIR taps"),
    );
    expect(() => quantizeForTarget(saved(butter, "q31"), { ...small, capacity: { maxSections: 1, maxFirTaps: 0 } })).toThrow(
      "the filter needs 2 sections and 0 FIR taps; press-ctl/ram-position takes at most 1 section and 0 FIR taps",
    );
    expect(quantizedParts(quantizeForTarget(saved(chain, "q31"), target("q31", { maxSections: 7, maxFirTaps: 255 })))).toHaveLength(3);
  });

  it("sends the stored quantized form for the format it was saved for, and quantizes the design afresh for another", () => {
    const rev = legacyFirRevision();
    expect(rev.design.taps).toHaveLength(31);
    const stored = quantizeForTarget(rev, target("q15"));
    expect(stored).toBe(rev.quantized); // the sections the old revision was stored with, word for word
    expect(stored.sos).toHaveLength(15);
    const fresh = quantizeForTarget(rev, target("q31"));
    expect(fresh.taps).toHaveLength(31); // quantized now: an FIR goes as taps
    expect(fresh.sos).toBeUndefined();
  });
});

describe("stored channel entries", () => {
  it("reads an entry stored before chains as one sections stage, every word as stored, its stored hash unchanged", async () => {
    const legacy = { revisionId: "5", format: "q15" as const, sampleRateHz: 1000, sections: [{ words: [1024, 2048, 1024, -20000, 9000], shift: 1 }] };
    const before = nodeChannelChecksum(legacy);
    const current = currentChannelConfig(legacy);
    expect(current).toEqual({ revisionId: "5", format: "q15", sampleRateHz: 1000, stages: [{ kind: "sections", sections: legacy.sections }] });
    expect(nodeChannelChecksum(legacy)).toBe(before);
    expect(currentChannelConfig({ ...legacy, sections: [] })).toMatchObject({ stages: [] });
    const f32 = { revisionId: "6", format: "f32" as const, sampleRateHz: 1000, sections: [[0.5, 0, 0, 1, -0.25, 0]] };
    const onePole = designFilter({ kind: "coefficients", sos: f32.sections, sampleRateHz: 1000 });
    expect(entryDesign(currentChannelConfig(f32), onePole)?.sos).toEqual(f32.sections);
    expect(currentChannelConfig(current)).toEqual(current);
    expect(() => currentChannelConfig({ ...legacy, sections: undefined })).toThrow();
  });
});
