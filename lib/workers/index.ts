import { env } from "@/lib/env";
import { AppError } from "@/lib/errors";
import type { Job, JobResult } from "./jobs";
import { createWorkPool, workerEntry, WorkBusy, WorkFailed, WorkTimeout, type WorkPool } from "./pool";

export { createWorkPool, workerEntry, WorkBusy, WorkFailed, WorkTimeout, type WorkPool } from "./pool";
export type { Job, JobResult } from "./jobs";

/** Pool settings from the environment (DESIGN_THREADS, DESIGN_TIMEOUT_MS, DESIGN_QUEUE, DESIGN_PER_USER). */
export function poolSettings(): Omit<Parameters<typeof createWorkPool>[0], "entry" | "log"> {
  const e = env();
  return { size: e.DESIGN_THREADS, timeoutMs: e.DESIGN_TIMEOUT_MS, maxQueued: e.DESIGN_QUEUE, maxPerOwner: e.DESIGN_PER_USER };
}

declare global {
  // One pool per process, kept on globalThis so that Next's module reloads in development reuse it.
  var tapwrightWork: WorkPool | undefined;
}

/** The web app's pool of design threads (one per process, started on first use). */
export function workPool(): WorkPool {
  globalThis.tapwrightWork ??= createWorkPool({ ...poolSettings(), entry: workerEntry(), log: (m) => console.warn(`[work] ${m}`) });
  return globalThis.tapwrightWork;
}

/**
 * Runs a job for a request on the web app's threads. Refusals before the start are 429 (this user
 * has enough in hand) or 503 (the server is busy); a job past the time limit is 422; what the job
 * itself refused is 422 with `failedAs` before its message; a crashed thread is 503.
 */
export async function computeForRequest<J extends Job>(job: J, owner: string, failedAs: string): Promise<JobResult<J>> {
  try {
    return await workPool().run(job, owner);
  } catch (err) {
    throw workError(err, failedAs);
  }
}

/** A pool error as the AppError a client sees (see computeForRequest). */
export function workError(err: unknown, failedAs: string): unknown {
  if (err instanceof WorkBusy) return new AppError(err.reason === "owner" ? "too_many_requests" : "unavailable", err.message);
  if (err instanceof WorkTimeout) {
    return new AppError("unprocessable", `${err.message} Make the design smaller: fewer sections, taps or stages.`);
  }
  if (err instanceof WorkFailed && err.kind === "crashed") {
    console.error("[work]", err.message);
    return new AppError("unavailable", "The computation could not finish on the server; try a smaller design.");
  }
  if (err instanceof WorkFailed) return new AppError("unprocessable", err.kind === "refusal" ? err.message : `${failedAs}: ${err.message}`);
  return err;
}
