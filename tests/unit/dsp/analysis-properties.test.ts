import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { frequencyResponse, sectionInStabilityTriangle, stability } from "@/lib/dsp/analysis";
import type { FilterDesign } from "@/lib/dsp/types";

const FS = 1000;

function design(parts: { sos?: number[][]; taps?: number[] }): FilterDesign {
  return { sampleRateHz: FS, zeros: [], poles: [], gain: 1, ...parts };
}

/** A biquad with a conjugate pole pair of radius < 0.999 and a conjugate zero pair of radius ≤ 1.5 (unit circle included). */
const stableSection = fc
  .record({
    poleRadius: fc.double({ min: 0, max: 0.999, noNaN: true }),
    poleAngle: fc.double({ min: 0, max: Math.PI, noNaN: true }),
    zeroRadius: fc.oneof(fc.constant(1), fc.double({ min: 0, max: 1.5, noNaN: true })),
    zeroAngle: fc.double({ min: 0, max: Math.PI, noNaN: true }),
    gain: fc.double({ min: 1e-3, max: 10, noNaN: true }),
  })
  .map(({ poleRadius, poleAngle, zeroRadius, zeroAngle, gain }) => [
    gain,
    -2 * gain * zeroRadius * Math.cos(zeroAngle),
    gain * zeroRadius * zeroRadius,
    1,
    -2 * poleRadius * Math.cos(poleAngle),
    poleRadius * poleRadius,
  ]);

const frequencies = fc.array(fc.double({ min: 0, max: FS / 2, noNaN: true }), { minLength: 1, maxLength: 40 });

describe("analysis properties (fast-check)", () => {
  it("magnitude, phase and group delay are finite for random stable SOS, unit-circle zeros included", () => {
    fc.assert(
      fc.property(fc.array(stableSection, { minLength: 1, maxLength: 6 }), frequencies, (sos, f) => {
        const d = design({ sos });
        expect(stability(d).stable).toBe(true);
        const r = frequencyResponse(d, [0, ...f, FS / 2]);
        for (const v of [...r.magnitudeDb, ...r.phaseRad, ...r.groupDelaySamples]) expect(Number.isFinite(v)).toBe(true);
      }),
    );
  });

  it("a pure delay z^−k has group delay k samples, as taps or as SOS rows", () => {
    fc.assert(
      fc.property(fc.integer({ min: 0, max: 40 }), frequencies, (k, f) => {
        const taps = [...new Array<number>(k).fill(0), 1];
        for (const gd of frequencyResponse(design({ taps }), f).groupDelaySamples) expect(gd).toBeCloseTo(k, 9);
        const rows = Array.from({ length: Math.max(1, Math.ceil(k / 2)) }, (_, i) =>
          2 * i + 1 < k ? [0, 0, 1, 1, 0, 0] : 2 * i < k ? [0, 1, 0, 1, 0, 0] : [1, 0, 0, 1, 0, 0],
        );
        for (const gd of frequencyResponse(design({ sos: rows }), f).groupDelaySamples) expect(gd).toBeCloseTo(k, 9);
      }),
    );
  });

  it("a symmetric N-tap FIR has group delay (N−1)/2 at every frequency (Oppenheim & Schafer, Discrete-Time Signal Processing, 3rd ed., §5.7)", () => {
    fc.assert(
      fc.property(
        fc.array(fc.double({ min: -1, max: 1, noNaN: true }), { minLength: 1, maxLength: 30 }),
        fc.boolean(),
        frequencies,
        (half, odd, f) => {
          const taps = [...half, ...(odd ? [0.5] : []), ...half.slice().reverse()];
          if (taps.every((t) => Math.abs(t) < 1e-3)) return;
          const r = frequencyResponse(design({ taps }), f);
          // Near an off-circle zero pair of the random taps the delay is ill-conditioned; compare where |H| > −200 dB.
          r.groupDelaySamples.forEach((gd, i) => {
            if (r.magnitudeDb[i] > -200) expect(gd).toBeCloseTo((taps.length - 1) / 2, 5);
          });
        },
      ),
    );
  });

  it("the stability triangle agrees with the pole radii of a biquad denominator", () => {
    fc.assert(
      fc.property(fc.double({ min: -2.5, max: 2.5, noNaN: true }), fc.double({ min: -1.5, max: 1.5, noNaN: true }), (a1, a2) => {
        const { maxPoleRadius } = stability(design({ sos: [[1, 0, 0, 1, a1, a2]] }));
        if (Math.abs(maxPoleRadius - 1) < 1e-9) return;
        expect(sectionInStabilityTriangle(a1, a2)).toBe(maxPoleRadius < 1);
      }),
    );
  });
});
