import { z } from "zod";

/** Building blocks of the design-request schemas (spec.ts and the kinds in their own files). */

export const finite = (what: string) => z.number({ error: `${what} must be a finite number` });

export const sampleRateHz = finite("sampleRateHz").positive({ error: "sampleRateHz must be a finite number > 0 Hz" });

export const coefficientList = (what: string, max: number) =>
  z
    .array(finite(`every ${what} coefficient`), { error: `${what} must be a list of numbers` })
    .min(1, { error: `${what} must have at least 1 coefficient` })
    .max(max, { error: `${what} must have at most ${max} coefficients` });

export type Ctx = z.RefinementCtx;

export function refuse(ctx: Ctx, path: Array<string | number>, message: string): void {
  ctx.addIssue({ code: "custom", path, message });
}

export function checkBelowNyquist(ctx: Ctx, field: string, value: number, fs: number): void {
  if (!(value > 0 && value < fs / 2)) {
    refuse(ctx, [field], `${field} must satisfy 0 < f < sampleRateHz/2 = ${fs / 2} Hz (got ${value})`);
  }
}

export function checkInteger(ctx: Ctx, field: string, value: number, min: number, max: number): void {
  if (!(Number.isInteger(value) && value >= min && value <= max)) {
    refuse(ctx, [field], `${field} must be an integer from ${min} to ${max} (got ${value})`);
  }
}
