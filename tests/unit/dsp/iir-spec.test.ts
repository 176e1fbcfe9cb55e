import { describe, expect, it } from "vitest";
import { z } from "zod";
import { iirSpecSchema } from "@/lib/dsp/iir/spec";
import { designIir } from "@/lib/dsp/iir/design";

const base = { kind: "iir", family: "butterworth", response: "lowpass", order: 4, cutoffHz: 100, sampleRateHz: 1000 } as const;
const issuesOf = (spec: unknown) => iirSpecSchema.safeParse(spec).error?.issues ?? [];

describe("iirSpecSchema", () => {
  it("accepts valid specs of every family", () => {
    expect(iirSpecSchema.safeParse(base).success).toBe(true);
    expect(iirSpecSchema.safeParse({ ...base, family: "elliptic", response: "bandstop", order: 6, cutoffHz: [10, 20], passbandRippleDb: 0.5, stopbandAttenuationDb: 60 }).success).toBe(true);
    expect(iirSpecSchema.safeParse({ ...base, family: "bessel", besselNorm: "mag", order: 12 }).success).toBe(true);
  });

  it.each([
    ["order 0", { order: 0 }, ["order"], "whole number from 1 to 12"],
    ["order 13 for lowpass", { order: 13 }, ["order"], "whole number from 1 to 12"],
    ["order 2.5", { order: 2.5 }, ["order"], "whole number from 1 to 12"],
    ["order 7 for bandpass", { response: "bandpass", order: 7, cutoffHz: [10, 20] }, ["order"], "whole number from 1 to 6"],
    ["order NaN", { order: NaN }, ["order"], "finite number"],
    ["a pair for lowpass", { cutoffHz: [10, 20] }, ["cutoffHz"], "single frequency"],
    ["a number for bandstop", { response: "bandstop", cutoffHz: 10 }, ["cutoffHz"], "pair [low, high]"],
    ["a decreasing pair", { response: "bandpass", cutoffHz: [20, 10] }, ["cutoffHz"], "low edge must be below the high edge"],
    ["an equal pair", { response: "bandpass", cutoffHz: [20, 20] }, ["cutoffHz"], "low edge must be below the high edge"],
    ["cutoff 0", { cutoffHz: 0 }, ["cutoffHz"], "above 0 Hz and below half the sample rate (500 Hz)"],
    ["cutoff at Nyquist", { cutoffHz: 500 }, ["cutoffHz"], "above 0 Hz and below half the sample rate (500 Hz)"],
    ["band edge above Nyquist", { response: "bandpass", cutoffHz: [100, 600] }, ["cutoffHz", 1], "The high edge must be above 0 Hz and below half the sample rate"],
    ["NaN cutoff", { cutoffHz: NaN }, ["cutoffHz"], "finite number"],
    ["sample rate 0", { sampleRateHz: 0 }, ["sampleRateHz"], "finite number above 0 Hz"],
    ["infinite sample rate", { sampleRateHz: Infinity }, ["sampleRateHz"], "finite number"],
    ["chebyshev1 without ripple", { family: "chebyshev1" }, ["passbandRippleDb"], "required for chebyshev1 and must be above 0 dB"],
    ["chebyshev1 with ripple 0", { family: "chebyshev1", passbandRippleDb: 0 }, ["passbandRippleDb"], "above 0 dB"],
    ["chebyshev2 without attenuation", { family: "chebyshev2" }, ["stopbandAttenuationDb"], "required for chebyshev2 and must be above 0 dB"],
    ["elliptic without ripple", { family: "elliptic", stopbandAttenuationDb: 40 }, ["passbandRippleDb"], "required for elliptic"],
    ["elliptic without attenuation", { family: "elliptic", passbandRippleDb: 1 }, ["stopbandAttenuationDb"], "required for elliptic"],
    ["elliptic attenuation ≤ ripple", { family: "elliptic", passbandRippleDb: 3, stopbandAttenuationDb: 3 }, ["stopbandAttenuationDb"], "greater than the passband ripple"],
    ["an unknown family", { family: "chebyshev3" }, ["family"], ""],
    ["an unknown Bessel norm", { family: "bessel", besselNorm: "group" }, ["besselNorm"], ""],
  ] as const)("refuses %s on the right path with the allowed range", (_name, over, path, message) => {
    const issues = issuesOf({ ...base, ...over });
    const hit = issues.find((i) => JSON.stringify(i.path) === JSON.stringify(path));
    expect(hit, JSON.stringify(issues)).toBeDefined();
    expect(hit?.message).toContain(message);
    expect(() => designIir({ ...base, ...over } as never)).toThrow();
  });

  it("stays usable inside z.discriminatedUnion (zod 4)", () => {
    const union = z.discriminatedUnion("kind", [iirSpecSchema, z.object({ kind: z.literal("fir"), taps: z.number() })]);
    expect(union.safeParse(base).success).toBe(true);
    const refused = union.safeParse({ ...base, order: 13 });
    expect(refused.error?.issues[0]?.path).toEqual(["order"]);
  });
});
