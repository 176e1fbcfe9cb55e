/**
 * Code generation for specialised inner loops: coefficients become literal constants, so the JIT
 * can keep them and the filter state in registers. Only numbers that pass Number.isFinite are
 * ever written into source; nothing else is interpolated.
 */

/** Bound on cached generated kernels; the oldest is dropped first. */
const KERNEL_CACHE_SIZE = 512;
const kernelCache = new Map<string, unknown>();

/** Set once code generation is refused (or turned off): every kernel is then the generic loop. */
let generationRefused = false;

/**
 * Turns kernel generation off for this JavaScript realm. The web app calls it in the browser, where
 * its Content-Security-Policy has no 'unsafe-eval', so no refused attempt is ever made there.
 */
export function refuseCodeGeneration(): void {
  generationRefused = true;
}

/** A JavaScript literal for a finite double, exact on parse (shortest round-trip form; −0 kept). */
export function numberLiteral(v: number): string {
  if (typeof v !== "number" || !Number.isFinite(v)) {
    throw new Error(`kernel coefficient must be a finite number (got ${String(v)})`);
  }
  return Object.is(v, -0) ? "(-0)" : `(${String(v)})`;
}

/**
 * Compile `source` as a function of `params` (cached by source text). Returns undefined when code
 * generation is turned off or refused (a Content-Security-Policy without 'unsafe-eval' throws
 * EvalError; the refusal is remembered), so callers fall back to their generic loop.
 */
export function compileKernel<K>(params: readonly string[], source: string): K | undefined {
  if (generationRefused) return undefined;
  const key = `${params.join(",")}\n${source}`;
  const cached = kernelCache.get(key);
  if (cached) return cached as K;
  let kernel: K;
  try {
    kernel = new Function(...params, source) as K;
  } catch (error) {
    if (error instanceof EvalError) {
      generationRefused = true;
      return undefined;
    }
    throw error;
  }
  if (kernelCache.size >= KERNEL_CACHE_SIZE) kernelCache.delete(kernelCache.keys().next().value as string);
  kernelCache.set(key, kernel);
  return kernel;
}
