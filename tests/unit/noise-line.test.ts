import { describe, expect, it } from "vitest";
import fixture from "../fixtures/dsp/noise-line-attenuation.json";
import { candidateFigures } from "@/lib/bench/figures";
import { judgedLine, readNoiseLine, STRONGEST } from "@/lib/bench/noise-line";
import { designFilter, filterSignal, liveDesign, peakGainDb, type FilterSpec } from "@/lib/dsp";
import { mulberry32 } from "@/server/demo-rig/prng";
import { candidateMetrics, rawSpectrum } from "@/server/pipeline/metrics";

const tol = fixture.tolerance.attenuationDbAbsolute;
/** Past this depth |H| is a rounding error in both tools; both must merely be that deep. */
const NUMERICAL_ZERO_DB = 150;

/** One second of a 3.2 Hz load swing (the wanted signal, strongest), 50 Hz hum and noise at 1 kHz. */
function liveBlock(design: ReturnType<typeof designFilter>) {
  const fs = 1000;
  const rnd = mulberry32(3);
  const raw = Float64Array.from({ length: 3000 }, (_, i) => 40 * Math.sin((2 * Math.PI * 3.2 * i) / fs) + 5 * Math.sin((2 * Math.PI * 50 * i) / fs) + 0.2 * (rnd() - 0.5));
  const out = filterSignal(design, raw);
  const last = (v: Float64Array) => v.subarray(v.length - fs);
  return { raw: last(raw), out: last(out), spectrum: rawSpectrum(last(raw), fs) };
}

describe(`the attenuation at a noise line against scipy ${fixture.scipyVersion} freqz`, () => {
  it.each(fixture.cases.map((c) => [c.call, c] as const))("%s: the table and the live prediction give the same figure at each line", (_call, c) => {
    const design = designFilter(c.spec as FilterSpec);
    const block = liveBlock(design);
    fixture.linesHz.forEach((line, i) => {
      const table = candidateFigures(design, { noiseLineHz: line }).attenuationAtNoiseDb!;
      const live = candidateMetrics(block.raw, block.out, { design, passbandDb: peakGainDb(design) }, block.spectrum, line);
      expect(live.noiseLineHz).toBe(line);
      expect(live.predictedAttenuationDb).toBe(table);
      const reference = c.attenuationDb[i];
      if (reference > NUMERICAL_ZERO_DB) expect(table).toBeGreaterThan(NUMERICAL_ZERO_DB);
      else expect(Math.abs(table - reference)).toBeLessThanOrEqual(tol);
    });
  });

  it("a Q 30 notch at 49.98 Hz judged at 50 Hz instead of its centre loses over 200 dB: the frequency must be the same one", () => {
    const [notch] = fixture.cases;
    const at = (f: number) => notch.attenuationDb[fixture.linesHz.indexOf(f)];
    expect(at(49.98) - at(50)).toBeGreaterThan(200);
  });
});

describe("the live metrics' noise line", () => {
  const live = liveDesign({ kind: "notch", shape: "notch", centerHz: 50, q: 30, sampleRateHz: 1000 });
  const { design } = live;

  it("without a choice is the strongest raw peak — here the wanted 3.2 Hz swing", () => {
    const b = liveBlock(design);
    expect(candidateMetrics(b.raw, b.out, live, b.spectrum).noiseLineHz).toBeCloseTo(3.2, 0);
  });

  it("with a chosen line is that line, measured and predicted there", () => {
    const b = liveBlock(design);
    const m = candidateMetrics(b.raw, b.out, live, b.spectrum, 50);
    expect(m.noiseLineHz).toBe(50);
    expect(m.predictedAttenuationDb!).toBeGreaterThan(100);
    // One Welch bin (1000/1000 Hz here) averages the notch's flanks, so the measured figure is shallower but still deep.
    expect(m.measuredAttenuationDb!).toBeGreaterThan(20);
  });

  it("falls back to the strongest peak for a line outside 0 < f < fs/2", () => {
    const b = liveBlock(design);
    for (const bad of [0, -5, 500, 700]) expect(candidateMetrics(b.raw, b.out, live, b.spectrum, bad).noiseLineHz).toBeCloseTo(3.2, 0);
  });
});

describe("the bench's noise line choice", () => {
  it("defaults to the strongest peak and says so", () => {
    expect(judgedLine(STRONGEST, [3.2, 50, 150])).toEqual({ freqHz: 3.2, label: "3.2 Hz (the strongest peak)" });
    expect(judgedLine(STRONGEST, []).freqHz).toBeNull();
  });

  it("keeps a picked or typed line whatever the spectrum's order", () => {
    expect(judgedLine({ kind: "chosen", freqHz: 50, from: "peak" }, [3.2, 50])).toEqual({ freqHz: 50, label: "50 Hz (a peak you picked)" });
    expect(judgedLine({ kind: "chosen", freqHz: 49.98, from: "typed" }, [])).toEqual({ freqHz: 49.98, label: "49.98 Hz (a frequency you typed)" });
  });

  it("reads a typed frequency strictly between 0 and fs/2, refusing a decimal comma", () => {
    expect(readNoiseLine("49.98", 1000)).toEqual({ freqHz: 49.98 });
    expect(readNoiseLine("0", 1000)).toEqual({ error: "The noise line must lie between 0 and 500 Hz (half the sample rate)." });
    expect(readNoiseLine("500", 1000)).toHaveProperty("error");
    expect(readNoiseLine("49,98", 1000)).toEqual({ error: "Write decimals with a point: 49.98, not 49,98." });
  });
});
