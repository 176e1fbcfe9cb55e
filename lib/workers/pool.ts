import { existsSync } from "node:fs";
import path from "node:path";
import { Worker } from "node:worker_threads";
import type { Job, JobFailure, JobResult } from "./jobs";

/** A job ran past the pool's time limit; its thread was stopped. */
export class WorkTimeout extends Error {}

/** The pool refused a job before starting it: its owner has too many in hand, or the queue is full. */
export class WorkBusy extends Error {
  constructor(
    readonly reason: "owner" | "queue",
    message: string,
  ) {
    super(message);
  }
}

/**
 * The job threw (`refusal`: an export that must not be made; `failed`: anything else it threw), or its
 * thread died under it (`crashed`: out of memory, or it could not start).
 */
export class WorkFailed extends Error {
  constructor(
    readonly kind: JobFailure["kind"] | "crashed",
    message: string,
  ) {
    super(message);
  }
}

export interface PoolOptions {
  /** Worker threads. */
  size: number;
  /** Longest a job may run on a thread, ms; past it the thread is terminated and replaced. */
  timeoutMs: number;
  /** Jobs that may wait for a free thread, all owners together. */
  maxQueued: number;
  /** Jobs one owner (a user, a WebSocket connection) may have running or waiting. */
  maxPerOwner: number;
  /** Heap limit of each thread, MB: a job cannot take the process's memory. */
  maxHeapMb?: number;
  /** The worker entry (lib/workers/worker.mjs). */
  entry: string;
  log?: (message: string) => void;
}

export interface WorkPool {
  /** Runs a job on a worker thread; rejects with WorkBusy, WorkTimeout or WorkFailed. */
  run<J extends Job>(job: J, owner: string): Promise<JobResult<J>>;
  /** Jobs running and waiting. */
  load(): { running: number; queued: number };
  close(): Promise<void>;
}

/** Path of the worker entry inside a checkout (the web app and the sidecar both run from its root). */
export function workerEntry(root = process.cwd()): string {
  const entry = path.join(root, "lib", "workers", "worker.mjs");
  if (!existsSync(entry)) throw new Error(`The design worker ${entry} is missing: run Tapwright from its checkout's root.`);
  return entry;
}

interface Task {
  id: number;
  job: Job;
  owner: string;
  resolve: (value: never) => void;
  reject: (err: Error) => void;
}

interface Slot {
  worker: Worker;
  ready: boolean;
  task: Task | null;
  timer: NodeJS.Timeout | null;
}

type Reply = { ready: true } | { id: number; ok: true; value: unknown } | { id: number; ok: false; failure: JobFailure };

/**
 * A fixed set of worker threads for design and analysis, so that long work never blocks the event
 * loop that answers requests. Limits are checked before a job is queued; a running job that passes
 * the time limit has its thread terminated (the only way to stop synchronous work) and replaced.
 */
export function createWorkPool(opts: PoolOptions): WorkPool {
  const queue: Task[] = [];
  const slots: Slot[] = [];
  const perOwner = new Map<string, number>();
  let nextId = 0;
  let closed = false;

  function settle(task: Task): void {
    const left = (perOwner.get(task.owner) ?? 1) - 1;
    if (left > 0) perOwner.set(task.owner, left);
    else perOwner.delete(task.owner);
  }

  function spawn(): Slot {
    const worker = new Worker(opts.entry, { execArgv: [], resourceLimits: { maxOldGenerationSizeMb: opts.maxHeapMb ?? 512 } });
    worker.unref();
    const slot: Slot = { worker, ready: false, task: null, timer: null };
    worker.on("message", (reply: Reply) => onReply(slot, reply));
    worker.on("error", (err) => lost(slot, `the design worker failed: ${err.message}`));
    worker.on("exit", (code) => lost(slot, `the design worker stopped (exit code ${code})`));
    return slot;
  }

  function finish(slot: Slot): Task | null {
    const task = slot.task;
    if (slot.timer) clearTimeout(slot.timer);
    slot.task = null;
    slot.timer = null;
    if (task) settle(task);
    return task;
  }

  function onReply(slot: Slot, reply: Reply): void {
    if ("ready" in reply) {
      slot.ready = true;
      return dispatch();
    }
    const task = slot.task?.id === reply.id ? finish(slot) : null;
    if (task && reply.ok) task.resolve(reply.value as never);
    else if (task && !reply.ok) task.reject(new WorkFailed(reply.failure.kind, reply.failure.message));
    dispatch();
  }

  /** A thread died or was stopped: its job fails and a new thread takes its place. */
  function replace(slot: Slot, error: Error | null): void {
    const index = slots.indexOf(slot);
    if (index < 0) return;
    const task = finish(slot);
    slot.worker.removeAllListeners();
    void slot.worker.terminate();
    if (task && error) task.reject(error);
    if (!closed) slots[index] = spawn();
    dispatch();
  }

  function lost(slot: Slot, message: string): void {
    if (!slots.includes(slot)) return;
    opts.log?.(message);
    const failedBeforeReady = !slot.ready;
    replace(slot, new WorkFailed("crashed", message));
    // A thread that cannot even start would fail every job: refuse the waiting ones rather than spin.
    if (failedBeforeReady) {
      for (const task of queue.splice(0)) {
        settle(task);
        task.reject(new WorkFailed("crashed", message));
      }
    }
  }

  function dispatch(): void {
    for (const slot of slots) {
      if (!slot.ready || slot.task || queue.length === 0) continue;
      const task = queue.shift() as Task;
      slot.task = task;
      slot.timer = setTimeout(() => {
        opts.log?.(`a ${task.job.kind} job ran past ${opts.timeoutMs} ms; its thread was stopped`);
        replace(slot, new WorkTimeout(`The computation took longer than ${opts.timeoutMs / 1000} s and was stopped.`));
      }, opts.timeoutMs);
      slot.worker.postMessage({ id: task.id, job: task.job });
    }
  }

  for (let i = 0; i < opts.size; i++) slots.push(spawn());

  return {
    run<J extends Job>(job: J, owner: string): Promise<JobResult<J>> {
      if (closed) return Promise.reject(new WorkBusy("queue", "The design service is shutting down."));
      if ((perOwner.get(owner) ?? 0) >= opts.maxPerOwner) {
        return Promise.reject(new WorkBusy("owner", `At most ${opts.maxPerOwner} designs of yours may be in progress at once; wait for them to finish.`));
      }
      const idle = slots.some((s) => s.ready && !s.task);
      if (!idle && queue.length >= opts.maxQueued) {
        return Promise.reject(new WorkBusy("queue", "The server is busy with other designs; try again in a few seconds."));
      }
      perOwner.set(owner, (perOwner.get(owner) ?? 0) + 1);
      return new Promise<JobResult<J>>((resolve, reject) => {
        queue.push({ id: ++nextId, job, owner, resolve: resolve as (value: never) => void, reject });
        dispatch();
      });
    },
    load() {
      return { running: slots.filter((s) => s.task).length, queued: queue.length };
    },
    async close() {
      closed = true;
      for (const task of queue.splice(0)) task.reject(new WorkBusy("queue", "The design service is shutting down."));
      const stopping = slots.splice(0).map((slot) => {
        const task = finish(slot);
        task?.reject(new WorkBusy("queue", "The design service is shutting down."));
        slot.worker.removeAllListeners();
        return slot.worker.terminate();
      });
      await Promise.all(stopping);
    },
  };
}
