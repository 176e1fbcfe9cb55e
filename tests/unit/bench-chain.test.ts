import { describe, expect, it } from "vitest";
import { stageLevels } from "@/lib/bench/analysis";
import { tryDesign } from "@/lib/bench/candidates";
import { cautionsFor } from "@/lib/bench/cautions";
import {
  addHarmonicNotches,
  addStage,
  chainIssues,
  fromStages,
  harmonicFormSchema,
  MAX_STAGES,
  moveStage,
  removeStage,
  replaceStage,
  seedStage,
  setBypassed,
} from "@/lib/bench/chain-edit";
import { candidateFigures } from "@/lib/bench/figures";
import { specSummary } from "@/lib/bench/spec-text";
import { designFilter, quantizeDesign, specStages, type ChainSpec, type FilterSpec, type StageSpec } from "@/lib/dsp";

const fs = 1000;
const notch = (centerHz: number, q = 30): StageSpec => ({ kind: "biquad", shape: "notch", centerHz, q, sampleRateHz: fs });
const butter4: StageSpec = { kind: "iir", family: "butterworth", response: "lowpass", order: 4, cutoffHz: 100, sampleRateHz: fs };
const fir: StageSpec = { kind: "fir", response: "lowpass", window: "hamming", taps: 101, cutoffHz: 100, sampleRateHz: fs };
const chain = (...stages: ChainSpec["stages"]): ChainSpec => ({ kind: "chain", sampleRateHz: fs, stages });
const centres = (spec: FilterSpec) => specStages(spec).map((s) => (s.kind === "biquad" ? s.centerHz : s.kind));

describe("editing a candidate's chain", () => {
  it("keeps one running stage a single spec, and anything else a chain", () => {
    expect(fromStages([butter4], fs)).toEqual(butter4);
    expect(fromStages([{ ...butter4, bypassed: true }], fs)).toEqual(chain({ ...butter4, bypassed: true }));
    expect(fromStages([notch(50), butter4], fs)).toEqual(chain(notch(50), butter4));
  });

  it("adds, replaces, moves, bypasses and removes stages", () => {
    let spec: FilterSpec = butter4;
    spec = addStage(spec, notch(50)).spec;
    spec = addStage(spec, notch(150)).spec;
    expect(centres(spec)).toEqual(["iir", 50, 150]);
    spec = moveStage(spec, 0, 2).spec;
    expect(centres(spec)).toEqual([50, 150, "iir"]);
    spec = setBypassed(spec, 1, true).spec;
    expect(specStages(spec)[1].bypassed).toBe(true);
    spec = replaceStage(spec, 1, notch(100)).spec;
    expect(specStages(spec)[1]).toEqual({ ...notch(100), bypassed: true });
    expect(specSummary(spec)).toBe("Notch biquad · 50 Hz, Q 30 → Butterworth LP 4 · 100 Hz (1 bypassed)");
    spec = setBypassed(spec, 1, false).spec;
    expect(specStages(spec)[1]).toEqual(notch(100));
    spec = removeStage(spec, 0).spec;
    spec = removeStage(spec, 0).spec;
    expect(spec).toEqual(butter4);
  });

  it("refuses a ninth stage and removing the only one, in plain words", () => {
    const full = chain(...Array.from({ length: MAX_STAGES }, (_, k) => notch(50 * (k + 1))));
    const ninth = addStage(full, butter4);
    expect(ninth.spec).toBe(full);
    expect(ninth.note).toBe("A chain holds at most 8 stages; remove one before adding another.");
    const last = removeStage(butter4, 0);
    expect(last.spec).toBe(butter4);
    expect(last.note).toMatch(/needs at least one stage/);
  });
});

describe("spectrum clicks on a chain", () => {
  it("add a notch stage with the chain's notch Q, once per frequency", () => {
    const two = seedStage(notch(50, 12), 150.04, "notch", fs);
    expect(two.spec).toEqual(chain(notch(50, 12), notch(150, 12)));
    expect(two.stage).toBe(1);
    const again = seedStage(two.spec, 150.01, "notch", fs);
    expect(again.spec).toBe(two.spec);
    expect(again.note).toBe("Stage 2 already notches 150 Hz.");
  });

  it("move the first low-pass stage's cutoff, or add a Butterworth low-pass stage", () => {
    const withLp = seedStage(chain(notch(50), butter4), 180, "cutoff", fs);
    expect(withLp.spec).toEqual(chain(notch(50), { ...butter4, cutoffHz: 180 }));
    expect(withLp.stage).toBe(1);
    expect(seedStage(notch(50), 180, "cutoff", fs).spec).toEqual(chain(notch(50), { ...butter4, cutoffHz: 180 }));
  });

  it("say so when the chain is full", () => {
    const full = chain(...Array.from({ length: MAX_STAGES }, (_, k) => notch(40 * (k + 1))));
    expect(seedStage(full, 470, "notch", fs).note).toBe("A chain holds at most 8 stages; remove one before adding a notch at 470 Hz.");
  });
});

describe("harmonic series of notches", () => {
  it("adds notches at f0, 2·f0, 3·f0 with one Q after the existing stages", () => {
    const e = addHarmonicNotches(butter4, { fundamentalHz: 50, count: 3, q: 20 });
    expect(e.spec).toEqual(chain(butter4, notch(50, 20), notch(100, 20), notch(150, 20)));
    expect(e.stage).toBe(1);
    expect(e.note).toBeNull();
  });

  it("goes up to Nyquist, skips notched harmonics and says where the 8-stage limit cut it", () => {
    // 50 Hz at fs = 1 kHz: 9 harmonics lie below Nyquist (50 … 450 Hz).
    const e = addHarmonicNotches(chain(notch(50), butter4), { fundamentalHz: 50, count: null, q: 30 });
    expect(centres(e.spec)).toEqual([50, "iir", 100, 150, 200, 250, 300, 350]);
    expect(e.note).toBe("Skipped 50 Hz: already notched. Added 6 of 8 notches: a chain holds at most 8 stages, so 2 harmonics were left out.");
  });

  it("counts harmonics past a full chain as skipped when notched and as left out otherwise", () => {
    const full = chain(butter4, ...[50, 100, 150, 200, 250, 300, 350].map((f) => notch(f)));
    const e = addHarmonicNotches(full, { fundamentalHz: 50, count: null, q: 30 });
    expect(e.spec).toBe(full);
    expect(e.note).toBe(
      "Skipped 50 Hz, 100 Hz, 150 Hz, 200 Hz, 250 Hz, 300 Hz, 350 Hz: already notched. Added 0 of 2 notches: a chain holds at most 8 stages, so 2 harmonics were left out.",
    );
  });

  it("says how many harmonics fit below Nyquist when more were asked for", () => {
    const e = addHarmonicNotches(notch(150), { fundamentalHz: 150, count: 5, q: 30 });
    expect(centres(e.spec)).toEqual([150, 300, 450]);
    expect(e.note).toBe("Only 3 harmonics of 150 Hz lie below Nyquist (500 Hz). Skipped 150 Hz: already notched.");
  });

  it("checks its form: a fundamental below Nyquist, a whole count or up to Nyquist, a Q in range", () => {
    const ok = { fundamentalHz: 50, upToNyquist: false, count: 3, notchQ: 30, sampleRateHz: fs };
    expect(harmonicFormSchema.safeParse(ok).success).toBe(true);
    expect(harmonicFormSchema.safeParse({ ...ok, upToNyquist: true, count: undefined }).success).toBe(true);
    const issues = (v: object) => (harmonicFormSchema.safeParse(v).error?.issues ?? []).map((i) => `${i.path.join(".")}: ${i.message}`);
    expect(issues({ ...ok, fundamentalHz: 500 })).toEqual(["fundamentalHz: the fundamental must lie below Nyquist (500 Hz)"]);
    expect(issues({ ...ok, count: 2.5 })).toEqual(['count: give a whole number of harmonics from 1 to 1000, or tick "up to Nyquist"']);
    expect(issues({ ...ok, notchQ: 0 })).toEqual(["notchQ: Q must satisfy 0 < Q ≤ 1000"]);
  });
});

describe("refusals beside their stage", () => {
  it("put a stage's lines under that stage and the chain's own under the list", () => {
    const bad = chain(notch(50), { ...notch(150), sampleRateHz: 500 });
    const issues = chainIssues(bad, tryDesign(bad).error);
    expect(issues.byStage.get(1)).toEqual(["Stage 2 is designed for 500 Hz but the chain runs at 1000 Hz; every stage must use the chain's sample rate"]);
    expect(issues.chain).toEqual([]);
    const off = chain({ ...notch(50), bypassed: true });
    expect(chainIssues(off, tryDesign(off).error)).toEqual({ byStage: new Map(), chain: ["Every stage is bypassed; at least one stage must run"] });
  });

  it("give a single spec's lines to its one stage", () => {
    const bad = notch(600);
    expect(chainIssues(bad, tryDesign(bad).error).byStage.get(0)).toEqual(["The centre frequency must be above 0 Hz and below half the sample rate (500 Hz) (got 600 Hz)"]);
  });
});

describe("a chain in the comparison table, cautions and fixed-point view", () => {
  const spec = chain(notch(50), notch(150), butter4, fir);

  it("counts sections, taps and order over the running stages", () => {
    const f = candidateFigures(designFilter(spec));
    expect(f.sections).toBe(1 + 1 + 2);
    expect(f.taps).toBe(101);
    expect(f.order).toBe(2 + 2 + 4 + 100);
    const bypassed = candidateFigures(designFilter(chain(notch(50), { ...fir, bypassed: true })));
    expect(bypassed).toMatchObject({ sections: 1, taps: null, order: 2 });
  });

  it("names every notch band in the notch caution", () => {
    // Notch −3 dB width f0/Q (R. Bristow-Johnson, Audio EQ Cookbook: bandwidth from Q): 50 ± 0.833 Hz, 150 ± 2.5 Hz.
    const design = designFilter(chain(notch(50), notch(150)));
    const c = cautionsFor({ spec: chain(notch(50), notch(150)), design, deviceFormat: "q15" }).find((x) => x.kind === "notch");
    expect(c?.text).toContain("removes 49.17 Hz–50.83 Hz and 147.5 Hz–152.5 Hz");
  });

  it("gives the headroom of each running stage by its index in the spec", () => {
    const withBypass = chain({ ...notch(50), bypassed: true }, notch(150), butter4);
    const levels = stageLevels(withBypass, quantizeDesign(designFilter(withBypass), "q15"));
    expect(levels.map((l) => [l.stage, l.summary])).toEqual([
      [1, "Notch biquad · 150 Hz, Q 30"],
      [2, "Butterworth LP 4 · 100 Hz"],
    ]);
    for (const l of levels) {
      // L∞ scaling keeps every stage's peak gain at or below full scale (lib/dsp README, fixed point).
      expect(l.sinePeakDb).toBeLessThanOrEqual(1e-9);
      expect(l.mayOverflow).toBe(l.worstCaseDb > 0);
    }
    expect(stageLevels(butter4, quantizeDesign(designFilter(butter4), "q15"))).toEqual([]);
  });
});
