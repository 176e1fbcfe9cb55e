/** Time and timers, passed in so tests can drive them (fake timers or a manual clock). */
export interface Clock {
  /** Unix epoch milliseconds. */
  now(): number;
  setInterval(fn: () => void, ms: number): Timer;
  clearInterval(timer: Timer): void;
  setTimeout(fn: () => void, ms: number): Timer;
  clearTimeout(timer: Timer): void;
}

export type Timer = ReturnType<typeof setTimeout>;

/** The process clock; reads the globals at call time so vitest's fake timers apply. */
export const systemClock: Clock = {
  now: () => Date.now(),
  setInterval: (fn, ms) => setInterval(fn, ms),
  clearInterval: (t) => clearInterval(t),
  setTimeout: (fn, ms) => setTimeout(fn, ms),
  clearTimeout: (t) => clearTimeout(t),
};

/** A logger the sidecar writes to; console in production, a collector in tests. */
export interface Logger {
  info(message: string): void;
  warn(message: string): void;
}

export const consoleLogger: Logger = {
  info: (m) => console.log(`[sidecar] ${m}`),
  warn: (m) => console.warn(`[sidecar] ${m}`),
};
