import { checkFilter, type AlarmRule, type FilterCheck } from "@/lib/alarms";
import { buildRevisionContent, type RevisionContent } from "@/lib/coefficients";
import { designFilter, liveDesign, type FilterDesign, type FilterSpec, type LiveDesign, type QuantFormat } from "@/lib/dsp";
import { ExportRefusal, prepareExport, type ExportSource, type ExportTarget, type PreparedExport } from "@/lib/export";
import { errorMessage } from "@/lib/errors";

/** The work that may run long, as messages a worker thread can take: each is bounded by the spec's limits and a time limit. */
export type Job =
  | { kind: "design"; spec: FilterSpec }
  /** A candidate for the live pipeline: the design and its passband reference (so the stream never searches for it). */
  | { kind: "live-design"; spec: FilterSpec }
  | { kind: "revision-content"; spec: FilterSpec; format: QuantFormat }
  | { kind: "export"; source: ExportSource; target: ExportTarget; prefix?: string }
  /** A candidate and the production filter over raw samples against a channel's alarm rules (the review's hidden-excursion check). */
  | { kind: "filter-check"; rules: AlarmRule[]; candidate: FilterSpec; production: FilterDesign | null; samples: Float64Array; sampleRateHz: number };

/** What each kind of job answers. */
export interface JobResults {
  design: FilterDesign;
  "live-design": LiveDesign;
  "revision-content": RevisionContent;
  export: PreparedExport;
  "filter-check": { candidate: FilterCheck; production: FilterCheck | null };
}

export type JobResult<J extends Job> = JobResults[J["kind"]];

/** How a job failed, as it crosses the thread boundary (an Error's class does not survive structured clone). */
export interface JobFailure {
  /** `refusal` for an export that must not be made (ExportRefusal); `failed` for anything else the job threw. */
  kind: "refusal" | "failed";
  message: string;
}

/** Runs one job on this thread (inside a worker, or inline in tests). */
export async function runJob(job: Job): Promise<JobResults[Job["kind"]]> {
  switch (job.kind) {
    case "design":
      return designFilter(job.spec);
    case "live-design":
      return liveDesign(job.spec);
    case "revision-content":
      return buildRevisionContent(job.spec, job.format);
    case "export":
      return prepareExport(job.source, job.target, job.prefix);
    case "filter-check":
      return {
        candidate: checkFilter(job.rules, designFilter(job.candidate), job.samples, job.sampleRateHz),
        production: job.production && checkFilter(job.rules, job.production, job.samples, job.sampleRateHz),
      };
  }
}

/** A thrown value as a JobFailure. */
export function jobFailure(err: unknown): JobFailure {
  return { kind: err instanceof ExportRefusal ? "refusal" : "failed", message: errorMessage(err) };
}
