import { MagnitudeOverlay } from "@/components/sets/magnitude-overlay";
import { SpecDiff } from "@/components/sets/spec-diff";
import type { RevisionView } from "@/db/queries/revisions";
import { diffSpecs, magnitudeSeries, plotFrequencies } from "@/lib/coefficients";

/** Okabe–Ito sky blue and bluish green: the two revisions compared (amber stays reserved for production). */
const COLORS = ["#56B4E9", "#009E73"];

/** Two revisions side by side: changed spec fields and both magnitude responses; chosen with ?a=&b=. */
export function RevisionDiff({ revisions, a, b }: { revisions: RevisionView[]; a?: string; b?: string }) {
  const pick = (n: string | undefined, fallback: RevisionView) => revisions.find((r) => String(r.revision) === n) ?? fallback;
  const right = pick(b, revisions[0]);
  const left = pick(a, revisions[1]);
  const freqs = plotFrequencies(left.sampleRateHz);
  const [da, db] = magnitudeSeries([left.design, right.design], freqs);
  return (
    <section className="card space-y-3 p-4" aria-labelledby="diff-h" data-testid="revision-diff">
      <div className="flex flex-wrap items-end gap-3">
        <h2 id="diff-h" className="mr-auto font-semibold">Compare revisions</h2>
        <form className="flex items-end gap-2" method="get">
          {(["a", "b"] as const).map((k) => (
            <div key={k}>
              <label className="label" htmlFor={`diff-${k}`}>{k === "a" ? "From" : "To"}</label>
              <select id={`diff-${k}`} name={k} className="field" defaultValue={(k === "a" ? left : right).revision}>
                {revisions.map((r) => <option key={r.id} value={r.revision}>r{r.revision}</option>)}
              </select>
            </div>
          ))}
          <button className="btn-quiet">Compare</button>
        </form>
      </div>
      <SpecDiff changes={diffSpecs(left.spec, right.spec)} a={left.revision} b={right.revision} />
      <MagnitudeOverlay
        title={`Magnitude of r${left.revision} and r${right.revision}`}
        freqsHz={freqs}
        series={[
          { label: `r${left.revision}`, color: COLORS[0], db: da },
          { label: `r${right.revision}`, color: COLORS[1], dashed: true, db: db },
        ]}
      />
    </section>
  );
}
