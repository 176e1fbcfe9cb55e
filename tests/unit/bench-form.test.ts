import { zodResolver } from "@hookform/resolvers/zod";
import type { FieldErrors, FieldValues } from "react-hook-form";
import { describe, expect, it } from "vitest";
import { errorAt } from "@/components/bench/form-fields";
import { defaultRequirement, specFromRequirement } from "@/lib/bench/requirement";
import { defaultSpec, SPEC_KINDS } from "@/lib/bench/spec-defaults";
import { designFilter, filterSpecSchema, MAX_ORDER, orderRequirementSchema } from "@/lib/dsp";

/** Runs the editor's resolver (the same schema as lib/dsp) and returns the message shown beside `field`. */
async function messageFor(schema: typeof filterSpecSchema | typeof orderRequirementSchema, values: Record<string, unknown>, field: string) {
  const resolver = zodResolver(schema as typeof filterSpecSchema);
  const result = await resolver(values as never, undefined, { fields: {}, shouldUseNativeValidation: false });
  return errorAt(result.errors as FieldErrors<FieldValues>, field);
}

const iir = { kind: "iir", family: "butterworth", response: "lowpass", order: 4, cutoffHz: 120, sampleRateHz: 1000 };

describe("candidate editor validation (filterSpecSchema through zodResolver)", () => {
  it("starts every design kind from a valid spec that designs", () => {
    for (const kind of SPEC_KINDS) {
      const spec = defaultSpec(kind, 1000);
      expect(filterSpecSchema.safeParse(spec).success, kind).toBe(true);
      expect(() => designFilter(spec), kind).not.toThrow();
    }
  });

  it("starts the notch, comb and FIR design kinds from valid specs at every demo sample rate", () => {
    for (const fs of [100, 500, 1000, 2000, 5000, 44100]) {
      for (const kind of ["notch", "comb", "fir-equiripple", "fir-arbitrary"] as const) {
        const spec = defaultSpec(kind, fs);
        expect(filterSpecSchema.safeParse(spec).success, `${kind} at ${fs} Hz`).toBe(true);
        expect(() => designFilter(spec), `${kind} at ${fs} Hz`).not.toThrow();
      }
    }
  });

  it("puts a cutoff at or above Nyquist beside the cutoff field, with the allowed range", async () => {
    expect(await messageFor(filterSpecSchema, { ...iir, cutoffHz: 600 }, "cutoffHz")).toBe("The cutoff must be above 0 Hz and below half the sample rate (500 Hz) (got 600 Hz)");
  });

  it("puts an empty order (NaN from the input) beside the order field", async () => {
    expect(await messageFor(filterSpecSchema, { ...iir, order: NaN }, "order")).toBe("The order must be a finite number");
  });

  it("refuses an order above the response's maximum", async () => {
    expect(await messageFor(filterSpecSchema, { ...iir, response: "bandpass", order: 9, cutoffHz: [40, 80] }, "order")).toBe(
      `The order must be a whole number from 1 to ${MAX_ORDER.bandpass} for a bandpass (got 9)`,
    );
  });

  it("refuses a band whose low edge is not below the high edge, beside the cutoff pair", async () => {
    expect(await messageFor(filterSpecSchema, { ...iir, response: "bandstop", cutoffHz: [80, 40] }, "cutoffHz")).toMatch(/low edge must be below the high edge/);
  });

  it("asks for the passband ripple of an elliptic design", async () => {
    const values = { ...iir, family: "elliptic", stopbandAttenuationDb: 40 };
    expect(await messageFor(filterSpecSchema, values, "passbandRippleDb")).toBe("The passband ripple is required for elliptic and must be above 0 dB");
  });

  it("refuses Q = 0 for a biquad and asks for gain on a peaking biquad", async () => {
    const notch = { kind: "biquad", shape: "notch", centerHz: 50, q: 0, sampleRateHz: 1000 };
    expect(await messageFor(filterSpecSchema, notch, "q")).toBe("Q must be above 0 and at most 1000 (got 0)");
    const peak = { kind: "biquad", shape: "peaking", centerHz: 50, q: 2, sampleRateHz: 1000 };
    expect(await messageFor(filterSpecSchema, peak, "gainDb")).toBe("The gain is required for a peaking biquad (−60 to 60 dB)");
  });

  it("refuses an even-length highpass FIR beside the taps field", async () => {
    const fir = { kind: "fir", response: "highpass", window: "hamming", taps: 100, cutoffHz: 100, sampleRateHz: 1000 };
    expect(await messageFor(filterSpecSchema, fir, "taps")).toMatch(/^The number of taps must be odd for a highpass/);
  });

  it("refuses an improper analog H(s) beside the numerator", async () => {
    const analog = { kind: "analog", num: [1, 0, 0], den: [1, 1], method: "tustin", sampleRateHz: 1000 };
    expect(await messageFor(filterSpecSchema, analog, "num")).toBe("H(s) must be proper: the numerator has degree 2, more than the denominator's 1");
  });

  it("asks for the prewarp frequency of tustin-prewarp", async () => {
    const analog = { kind: "analog", num: [1], den: [1, 1], method: "tustin-prewarp", sampleRateHz: 1000 };
    expect(await messageFor(filterSpecSchema, analog, "prewarpHz")).toBe("A prewarp frequency is required for Tustin with prewarping (above 0 Hz and below half the sample rate (500 Hz))");
  });

  it("refuses pasted coefficients with a[0] = 0 beside a", async () => {
    const pasted = { kind: "coefficients", b: [1, 2], a: [0, 1], sampleRateHz: 1000 };
    expect(await messageFor(filterSpecSchema, pasted, "a.0")).toBe("The first coefficient of a (denominator), a0, must be nonzero (it is normalised to 1)");
  });

  it("has no errors for a valid spec", async () => {
    const resolver = zodResolver(filterSpecSchema);
    const result = await resolver(iir as never, undefined, { fields: {}, shouldUseNativeValidation: false });
    expect(result.errors).toEqual({});
  });
});

describe("requirement mode (orderRequirementSchema + estimateOrder)", () => {
  it("puts edges in the wrong order beside the stop edge", async () => {
    const req = { ...defaultRequirement(1000), passbandHz: 200, stopbandHz: 100 };
    expect(await messageFor(orderRequirementSchema, req, "stopbandHz")).toBe("a lowpass needs the passband edge below the stopband edge");
  });

  it("turns the default requirement into a valid IIR spec at the estimated order", () => {
    const spec = specFromRequirement(defaultRequirement(1000));
    expect(spec.kind).toBe("iir");
    expect(filterSpecSchema.safeParse(spec).success).toBe(true);
    // Reference: Debian scipy 1.10.1, scipy.signal.buttord(80, 160, 1, 40, fs=1000) → (7, 87.71915953844804).
    if (spec.kind !== "iir") return;
    expect(spec.order).toBe(7);
    expect(spec.cutoffHz as number).toBeCloseTo(87.71915953844804, 6);
  });
});
