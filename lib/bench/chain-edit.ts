import { z } from "zod";
import { SPEC_LIMITS, specStages, type ChainStage, type FilterSpec, type StageSpec } from "@/lib/dsp";
import { tryDesign } from "./candidates";
import { hz } from "./format";

/** Most stages in a candidate's chain (lib/dsp's limit). */
export const MAX_STAGES = SPEC_LIMITS.maxChainStages;

/** Quality factor of a seeded notch (common practice for mains hum: narrow, ≈ 190 ms ring at 50 Hz). */
export const SEED_NOTCH_Q = 30;

/** The result of one edit of a chain: the new spec, what to tell the engineer, and the stage it touched. */
export interface ChainEdit {
  spec: FilterSpec;
  /** A plain sentence when the edit was cut short or refused; null when it did all it was asked. */
  note: string | null;
  /** Index of the stage added or changed, or null when none was. */
  stage: number | null;
}

/** A stage without its bypass flag: what the stage form edits. */
export function stageSpecOf(stage: ChainStage): StageSpec {
  const { bypassed: _bypassed, ...spec } = stage;
  return spec;
}

/**
 * A candidate's spec from its stages: a single running stage stays a single spec (saved and sent as
 * before chains existed); anything else is a chain at sample rate fs.
 */
export function fromStages(stages: ChainStage[], sampleRateHz: number): FilterSpec {
  if (stages.length === 1 && stages[0].bypassed !== true) return stageSpecOf(stages[0]);
  return { kind: "chain", sampleRateHz, stages };
}

const edit = (spec: FilterSpec, stages: ChainStage[], stage: number | null, note: string | null = null): ChainEdit => ({
  spec: fromStages(stages, spec.sampleRateHz),
  note,
  stage,
});
const unchanged = (spec: FilterSpec, note: string): ChainEdit => ({ spec, note, stage: null });
const fullNote = (what: string) => `A chain holds at most ${MAX_STAGES} stages; remove one before adding ${what}.`;

/** Adds a stage at the end, unless the chain is full. */
export function addStage(spec: FilterSpec, stage: StageSpec): ChainEdit {
  const stages = specStages(spec);
  if (stages.length >= MAX_STAGES) return unchanged(spec, fullNote("another"));
  return edit(spec, [...stages, stage], stages.length);
}

/** Replaces stage i's design, keeping whether it is bypassed. */
export function replaceStage(spec: FilterSpec, i: number, stage: StageSpec): ChainEdit {
  const stages = specStages(spec).map((s, k) => (k === i ? (s.bypassed ? { ...stage, bypassed: true } : stage) : s));
  return edit(spec, stages, i);
}

/** Moves stage i to position `to` (the others keep their order). */
export function moveStage(spec: FilterSpec, i: number, to: number): ChainEdit {
  const stages = [...specStages(spec)];
  if (to < 0 || to >= stages.length || i < 0 || i >= stages.length) return { spec, note: null, stage: i };
  const [moved] = stages.splice(i, 1);
  stages.splice(to, 0, moved);
  return edit(spec, stages, to);
}

/** Bypasses stage i (kept in the chain, not run) or runs it again. */
export function setBypassed(spec: FilterSpec, i: number, bypassed: boolean): ChainEdit {
  const stages = specStages(spec).map((s, k) => (k !== i ? s : bypassed ? { ...stageSpecOf(s), bypassed: true } : stageSpecOf(s)));
  return edit(spec, stages, i);
}

/** Removes stage i, unless it is the only one (a candidate always has a stage). */
export function removeStage(spec: FilterSpec, i: number): ChainEdit {
  const stages = specStages(spec);
  if (stages.length <= 1) return unchanged(spec, "A candidate needs at least one stage; remove the candidate instead.");
  return edit(
    spec,
    stages.filter((_, k) => k !== i),
    null,
  );
}

/** A frequency as a seed or a series sets it: 4 significant figures. */
const rounded = (f: number) => Number(f.toPrecision(4));

/** Index of the notch stage centred at f Hz (as rounded), or −1. */
function notchAt(stages: ChainStage[], f: number): number {
  return stages.findIndex((s) => s.kind === "biquad" && s.shape === "notch" && s.centerHz === f);
}

/** Index of the first low-pass stage with one cutoff or corner (IIR, FIR, exponential smoothing, low-pass biquad), or −1. */
function lowpassAt(stages: ChainStage[]): number {
  return stages.findIndex(
    (s) =>
      ((s.kind === "iir" || s.kind === "fir") && s.response === "lowpass" && typeof s.cutoffHz === "number") ||
      s.kind === "ema" ||
      (s.kind === "biquad" && s.shape === "lowpass"),
  );
}

/** The Q of the chain's last notch stage, so seeded notches match the engineer's choice; else SEED_NOTCH_Q. */
function notchQ(stages: ChainStage[]): number {
  const last = [...stages].reverse().find((s) => s.kind === "biquad" && s.shape === "notch");
  return last?.kind === "biquad" ? last.q : SEED_NOTCH_Q;
}

const notchSpec = (centerHz: number, q: number, sampleRateHz: number): StageSpec => ({ kind: "biquad", shape: "notch", centerHz, q, sampleRateHz });

/**
 * A click on a spectral peak at f Hz. "notch": adds a cookbook notch stage at f (with the Q of the
 * chain's last notch). "cutoff": moves the first low-pass stage's cutoff to f, or adds a 4th-order
 * Butterworth low-pass stage at f. With no spec, the new candidate's single stage.
 */
export function seedStage(spec: FilterSpec | null, freqHz: number, mode: "notch" | "cutoff", sampleRateHz: number): ChainEdit {
  const f = rounded(freqHz);
  const lowpass: StageSpec = { kind: "iir", family: "butterworth", response: "lowpass", order: 4, cutoffHz: f, sampleRateHz };
  if (spec === null) return { spec: mode === "notch" ? notchSpec(f, SEED_NOTCH_Q, sampleRateHz) : lowpass, note: null, stage: 0 };
  const stages = specStages(spec);
  if (mode === "notch") {
    const existing = notchAt(stages, f);
    if (existing >= 0) return unchanged(spec, `Stage ${existing + 1} already notches ${hz(f)}.`);
    if (stages.length >= MAX_STAGES) return unchanged(spec, fullNote(`a notch at ${hz(f)}`));
    return edit(spec, [...stages, notchSpec(f, notchQ(stages), sampleRateHz)], stages.length);
  }
  const i = lowpassAt(stages);
  if (i < 0) {
    if (stages.length >= MAX_STAGES) return unchanged(spec, fullNote(`a low-pass at ${hz(f)}`));
    return edit(spec, [...stages, lowpass], stages.length);
  }
  const s = stages[i];
  const moved: ChainStage = s.kind === "biquad" ? { ...s, centerHz: f } : s.kind === "iir" || s.kind === "fir" || s.kind === "ema" ? { ...s, cutoffHz: f } : s;
  return edit(
    spec,
    stages.map((x, k) => (k === i ? moved : x)),
    i,
  );
}

/** A harmonic series of notches: fundamental f0 in Hz, how many (null: every harmonic below Nyquist), one Q. */
export interface HarmonicSeries {
  fundamentalHz: number;
  count: number | null;
  q: number;
}

/** Most harmonics one series asks for (product choice; far more than a chain can hold). */
export const MAX_HARMONICS = 1000;

/** The harmonic series form: fundamental below Nyquist, a count or "up to Nyquist", one cookbook Q. */
export const harmonicFormSchema = z
  .object({
    fundamentalHz: z.number({ error: "give the fundamental in Hz" }).positive({ error: "the fundamental must be above 0 Hz" }),
    upToNyquist: z.boolean(),
    count: z.number({ error: "give how many harmonics" }).optional(),
    notchQ: z
      .number({ error: "give the notches' Q" })
      .positive({ error: `Q must satisfy 0 < Q ≤ ${SPEC_LIMITS.maxQ}` })
      .max(SPEC_LIMITS.maxQ, { error: `Q must satisfy 0 < Q ≤ ${SPEC_LIMITS.maxQ}` }),
    sampleRateHz: z.number().positive(),
  })
  .superRefine((v, ctx) => {
    if (v.fundamentalHz >= v.sampleRateHz / 2) {
      ctx.addIssue({ code: "custom", path: ["fundamentalHz"], message: `the fundamental must lie below Nyquist (${hz(v.sampleRateHz / 2)})` });
    }
    if (!v.upToNyquist && !(v.count !== undefined && Number.isInteger(v.count) && v.count >= 1 && v.count <= MAX_HARMONICS)) {
      ctx.addIssue({ code: "custom", path: ["count"], message: `give a whole number of harmonics from 1 to ${MAX_HARMONICS}, or tick "up to Nyquist"` });
    }
  });
export type HarmonicForm = z.infer<typeof harmonicFormSchema>;

/** The series a valid harmonic form asks for. */
export const seriesOf = (v: HarmonicForm): HarmonicSeries => ({ fundamentalHz: v.fundamentalHz, count: v.upToNyquist ? null : (v.count ?? 1), q: v.notchQ });

/**
 * Adds notch stages at f0, 2·f0, 3·f0 … (below Nyquist, up to the count), skipping harmonics a stage
 * already notches and stopping at the stage limit; the note says what was skipped or cut. The
 * fundamental must lie below Nyquist.
 */
export function addHarmonicNotches(spec: FilterSpec, series: HarmonicSeries): ChainEdit {
  const fs = spec.sampleRateHz;
  const nyquist = fs / 2;
  const { fundamentalHz: f0, count, q } = series;
  if (!(f0 > 0 && f0 < nyquist)) return unchanged(spec, `The fundamental must lie between 0 Hz and Nyquist (${hz(nyquist)}).`);
  const below = Math.ceil(nyquist / f0) - 1;
  const total = Math.min(count ?? below, below);
  const harmonic = (k: number) => rounded(k * f0);
  const stages = [...specStages(spec)];
  const skipped: number[] = [];
  const added: number[] = [];
  let k = 1;
  for (; k <= total && stages.length < MAX_STAGES; k++) {
    const f = harmonic(k);
    if (notchAt(stages, f) >= 0) skipped.push(f);
    else {
      stages.push(notchSpec(f, q, fs));
      added.push(f);
    }
  }
  // Harmonics past the stage limit: the ones a stage already notches are skipped, the rest cut.
  for (const s of stages) {
    if (s.kind !== "biquad" || s.shape !== "notch") continue;
    const n = Math.round(s.centerHz / f0);
    if (n >= k && n <= total && s.centerHz === harmonic(n) && !skipped.includes(s.centerHz)) skipped.push(s.centerHz);
  }
  const cut = total - added.length - skipped.length;
  const notes = [
    count !== null && count > below ? `Only ${below} harmonics of ${hz(f0)} lie below Nyquist (${hz(nyquist)}).` : null,
    skipped.length > 0 ? `Skipped ${skipped.map((f) => hz(f)).join(", ")}: already notched.` : null,
    cut > 0 ? `Added ${added.length} of ${added.length + cut} notches: a chain holds at most ${MAX_STAGES} stages, so ${cut} ${cut === 1 ? "harmonic was" : "harmonics were"} left out.` : null,
  ].filter((n): n is string => n !== null);
  const note = notes.length > 0 ? notes.join(" ") : null;
  if (added.length === 0) return { spec, note, stage: null };
  return edit(spec, stages, stages.length - added.length, note);
}

/** A refusal as a sentence: a plain first word capitalised; a field name (cutoffHz) or an abbreviation (sos) kept as it is. */
const sentence = (line: string) => (/^[a-z]{4,}\s/.test(line) ? line.charAt(0).toUpperCase() + line.slice(1) : line);

/** A chain's design error split into the lines that belong to one stage (by index in the spec) and the rest. */
export interface ChainIssues {
  byStage: Map<number, string[]>;
  chain: string[];
}

/**
 * Splits a design error (lib/dsp lines "path: message") into lines per stage, in the engineer's terms:
 * a chain's "stages.N.field: …" and "stage N+1: …" lines go to stage N without the path; a single spec's
 * lines all belong to its one stage, also without the path (each message names its field).
 */
export function chainIssues(spec: FilterSpec, error: string | null): ChainIssues {
  const byStage = new Map<number, string[]>();
  const chain: string[] = [];
  if (!error) return { byStage, chain };
  const put = (i: number, line: string) => byStage.set(i, [...(byStage.get(i) ?? []), sentence(line)]);
  for (const line of error.split("\n").filter((l) => l.trim() !== "")) {
    if (spec.kind !== "chain") {
      put(0, line.replace(/^[^\s:]+: /, ""));
      continue;
    }
    const path = /^stages\.(\d+)(?:\.[^:]*)?: (.*)$/.exec(line);
    const run = /^(?:quantized )?stage (\d+): (.*)$/.exec(line);
    if (path) put(Number(path[1]), path[2]);
    else if (run) put(Number(run[1]) - 1, run[2]);
    else chain.push(sentence(line.replace(/^stages: /, "")));
  }
  if (spec.kind === "chain" && byStage.size === 0 && chain.length > 0) return locateFailingStages(spec.stages, chain);
  return { byStage, chain };
}

/** A design error that names no stage (thrown while designing one): the stages that fail alone take their own errors. */
function locateFailingStages(stages: ChainStage[], lines: string[]): ChainIssues {
  const byStage = new Map<number, string[]>();
  stages.forEach((s, i) => {
    if (s.bypassed) return;
    const alone = tryDesign(stageSpecOf(s));
    if (alone.error) byStage.set(i, alone.error.split("\n").map(sentence));
  });
  return { byStage, chain: byStage.size > 0 ? [] : lines };
}
