// Entry of a design worker thread. It compiles the TypeScript of lib/ on import (tsx), then answers
// each {id, job} message with {id, ok, value} or {id, ok: false, failure}. The parent enforces the
// time limit by terminating the thread.
import { parentPort } from "node:worker_threads";
import { register } from "tsx/esm/api";

register();
const { runJob, jobFailure } = await import("./jobs.ts");

parentPort.on("message", async ({ id, job }) => {
  try {
    parentPort.postMessage({ id, ok: true, value: await runJob(job) });
  } catch (err) {
    parentPort.postMessage({ id, ok: false, failure: jobFailure(err) });
  }
});
parentPort.postMessage({ ready: true });
