import { compareArithmetic } from "@/lib/bench/arithmetic";
import type { RevisionContent } from "@/lib/coefficients";
import type { FixedArithmetic } from "@/lib/dsp";
import { formatHz, trim } from "@/lib/format/units";
import { errorMessage } from "@/lib/errors";

/** What the stored quantized form computes in an arithmetic, against the float design (the bench's fixed-point view runs the same). */
function arithmeticFact(rev: RevisionContent, arithmetic: FixedArithmetic): [string, string] | null {
  const q = rev.quantized;
  if (!q || q.format === "f32") return null;
  try {
    const c = compareArithmetic(rev.design, q, arithmetic);
    const worst = c.worstDbfs === null ? "no difference" : `worst ${c.worstDbfs.toFixed(1)} dBFS (${c.worstLsb.toPrecision(3)} LSB)`;
    return [`Arithmetic: ${c.label.split(":")[0]}`, `${worst} vs the float design on half-scale steps and a chirp, ${c.overflows} saturations or wraps`];
  } catch (err) {
    return [`Arithmetic: ${arithmetic}`, `not runnable: ${errorMessage(err)}`];
  }
}

/** The stored analysis of a revision in one line of facts, each with its unit. */
export function RevisionSummary({ rev }: { rev: RevisionContent & { format: string } }) {
  const a = rev.analysis;
  const facts: [string, string][] = [
    ["Stable", a.stable ? `yes (largest pole radius ${trim(a.maxPoleRadius, 5)})` : `no (pole radius ${trim(a.maxPoleRadius, 5)})`],
    ["−3 dB", a.cutoffsHz.length ? a.cutoffsHz.map((f) => formatHz(f)).join(", ") : "none"],
    ["Delay at DC", a.groupDelayDcMs === null ? "—" : `${trim(a.groupDelayDcMs, 3)} ms (${trim(a.groupDelayDcSamples ?? 0, 3)} samples)`],
    ["Step", a.step.overshootPercent === null ? "—" : `${trim(a.step.overshootPercent, 3)} % overshoot, settles in ${a.step.settlingTimeS === null ? "—" : `${trim(a.step.settlingTimeS * 1000, 3)} ms`}`],
    [
      `Quantized (${rev.format})`,
      rev.quantized
        ? `${rev.quantized.stable ? "stable" : "UNSTABLE"}, pole radius ${trim(rev.quantized.maxPoleRadius, 6)}, worst deviation ${trim(rev.quantized.maxDeviationDb, 3)} dB`
        : "could not be quantized",
    ],
    ...(["tapwright", "cmsis"] as const).map((a) => arithmeticFact(rev, a)).filter((f): f is [string, string] => f !== null),
  ];
  return (
    <dl className="grid gap-x-4 gap-y-0.5 text-xs sm:grid-cols-[auto_1fr]">
      {facts.map(([k, v]) => (
        <div key={k} className="contents">
          <dt className="text-slate-500">{k}</dt>
          <dd className="num">{v}</dd>
        </div>
      ))}
      {!a.deployable.ok && (
        <div className="contents">
          <dt className="text-fault">Not deployable</dt>
          <dd className="text-fault">{a.deployable.reason}</dd>
        </div>
      )}
    </dl>
  );
}
