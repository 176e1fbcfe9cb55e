import type { RevisionContent } from "@/lib/coefficients";
import { formatHz, trim } from "@/lib/format/units";

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
