"use client";

import { useEffect, useReducer, useRef } from "react";
import type { Complex, FilterDesign } from "@/lib/dsp";
import type { ZerosAnswer } from "./zeros-worker";
import { errorMessage } from "@/lib/errors";

/** Zeros found so far, per design object (designs are immutable; a new edit is a new object). */
const found = new WeakMap<FilterDesign, ZerosAnswer>();

/** What the pole-zero map knows of a design's zeros. */
export type ZerosState = { zeros: Complex[] } | { error: string } | { pending: true };

/**
 * The zeros of each design: carried by the design, or found in a Web Worker (one per design still
 * without them) so a long FIR's root finding never blocks the page; a worker whose design is no longer
 * shown is stopped.
 */
export function useDesignZeros(designs: FilterDesign[]): ZerosState[] {
  const [, refresh] = useReducer((n: number) => n + 1, 0);
  const running = useRef(new Map<FilterDesign, Worker>());
  useEffect(() => {
    const workers = running.current;
    for (const [design, worker] of workers) {
      if (!designs.includes(design)) {
        worker.terminate();
        workers.delete(design);
      }
    }
    for (const design of designs) {
      if (design.zeros || found.has(design) || workers.has(design)) continue;
      let worker: Worker;
      try {
        worker = new Worker(new URL("./zeros-worker.ts", import.meta.url), { type: "module" });
      } catch (err) {
        // A Content-Security-Policy without worker-src 'self' refuses it; the page says so instead of blocking.
        found.set(design, { error: `the browser refused the worker that finds them (${errorMessage(err)})` });
        refresh();
        continue;
      }
      workers.set(design, worker);
      const settle = (answer: ZerosAnswer) => {
        found.set(design, answer);
        worker.terminate();
        workers.delete(design);
        refresh();
      };
      worker.onmessage = (event: MessageEvent<ZerosAnswer>) => settle(event.data);
      worker.onerror = (event) => settle({ error: event.message || "the zeros could not be computed" });
      worker.postMessage(design);
    }
  }, [designs]);
  useEffect(() => {
    const workers = running.current;
    return () => {
      for (const worker of workers.values()) worker.terminate();
      workers.clear();
    };
  }, []);
  return designs.map((design) => (design.zeros ? { zeros: design.zeros } : (found.get(design) ?? { pending: true })));
}
