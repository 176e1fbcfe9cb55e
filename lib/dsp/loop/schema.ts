import { z } from "zod";
import { runForm } from "../analysis/design-form";
import { discretizationMethods } from "../discretize/discretize";
import { MAX_ANALOG_ORDER } from "../discretize/rational";
import type { FilterDesign } from "../types";

/** Limits of a loop model (product choices; each refusal states the allowed range). */
export const LOOP_LIMITS = {
  maxSampleRateHz: 1e6,
  maxGain: 1e9,
  minDerivativeN: 1,
  maxDerivativeN: 1000,
  maxDelaySamples: 1000,
  maxAnalogOrder: MAX_ANALOG_ORDER,
} as const;

const finite = (what: string) => z.number({ error: `${what} must be a finite number` });

const gain = (what: string, unit: string) =>
  finite(what).refine((v) => v >= 0 && v <= LOOP_LIMITS.maxGain, {
    error: `${what} must be from 0 to ${LOOP_LIMITS.maxGain} ${unit}`,
  });

const polynomial = (what: string) =>
  z
    .array(finite(`every ${what} coefficient`), { error: `${what} must be a list of numbers` })
    .min(1, { error: `${what} must have at least 1 coefficient` })
    .max(LOOP_LIMITS.maxAnalogOrder + 1, { error: `${what} must have at most ${LOOP_LIMITS.maxAnalogOrder + 1} coefficients` })
    .refine((p) => p.some((c) => c !== 0), { error: `${what} must have a nonzero coefficient` });

/** Degree of a polynomial in descending powers (leading zeros ignored). */
function degree(p: readonly number[]): number {
  const first = p.findIndex((c) => c !== 0);
  return first < 0 ? -1 : p.length - 1 - first;
}

/** H(s) as num/den in descending powers of s (s in rad/s), proper. */
const analogTf = (what: string) =>
  z
    .object({ num: polynomial(`${what} num`), den: polynomial(`${what} den`) })
    .refine((tf) => degree(tf.num) <= degree(tf.den), {
      error: `${what} must be proper: the degree of num must be at most that of den`,
    });

const method = z.enum(discretizationMethods, { error: `method must be one of ${discretizationMethods.join(", ")}` });

/**
 * PID in parallel form with a filtered derivative, C(s) = Kp + Ki/s + Kd·s/(1 + s·Tf), Tf = Td/N,
 * Td = Kd/Kp (Åström & Murray, Feedback Systems: An Introduction for Scientists and Engineers, §10.5). Units: Kp in u per unit error, Ki in u per
 * unit error per s, Kd in u·s per unit error; N dimensionless.
 */
export const pidControllerSchema = z.object({
  kind: z.literal("pid"),
  kp: gain("kp", "(controller output per unit error)"),
  ki: gain("ki", "(per unit error per s)"),
  kd: gain("kd", "(s per unit error)"),
  n: finite("n").refine((v) => v >= LOOP_LIMITS.minDerivativeN && v <= LOOP_LIMITS.maxDerivativeN, {
    error: `n (derivative filter) must be from ${LOOP_LIMITS.minDerivativeN} to ${LOOP_LIMITS.maxDerivativeN}`,
  }),
  method,
  prewarpHz: finite("prewarpHz").optional(),
});

/** A controller given as C(s) = num/den, discretised by `method`. */
export const tfControllerSchema = z.object({
  kind: z.literal("tf"),
  num: polynomial("controller num"),
  den: polynomial("controller den"),
  method,
  prewarpHz: finite("prewarpHz").optional(),
});

export const controllerSchema = z.discriminatedUnion("kind", [pidControllerSchema, tfControllerSchema], {
  error: "controller.kind must be 'pid' or 'tf'",
});

const filterDesign = z.custom<FilterDesign | null>(
  (v) => {
    if (v === null) return true;
    try {
      runForm(v as FilterDesign);
      return true;
    } catch {
      return false;
    }
  },
  { error: "filter must be null or a FilterDesign with finite sos rows (a0 = 1) or taps" },
);

/**
 * A discrete loop at sampleRateHz: plant P(s) driven through a zero-order hold, controller C,
 * `delaySamples` samples of pure (computation) delay and the sensor filter F(z) in the feedback path.
 */
export const loopModelSchema = z
  .object({
    sampleRateHz: finite("sampleRateHz").refine((v) => v > 0 && v <= LOOP_LIMITS.maxSampleRateHz, {
      error: `sampleRateHz must be above 0 and at most ${LOOP_LIMITS.maxSampleRateHz} Hz`,
    }),
    plant: analogTf("plant"),
    controller: controllerSchema,
    delaySamples: z
      .number({ error: "delaySamples must be a number" })
      .int({ error: "delaySamples must be an integer" })
      .min(0, { error: `delaySamples must be from 0 to ${LOOP_LIMITS.maxDelaySamples}` })
      .max(LOOP_LIMITS.maxDelaySamples, { error: `delaySamples must be from 0 to ${LOOP_LIMITS.maxDelaySamples}` }),
    filter: filterDesign,
  })
  .superRefine((m, ctx) => {
    const fs = m.sampleRateHz;
    const c = m.controller;
    if (c.kind === "pid") {
      if (c.kp === 0 && c.ki === 0 && c.kd === 0) {
        ctx.addIssue({ code: "custom", path: ["controller"], message: "at least one of kp, ki and kd must be above 0" });
      }
      if (c.kd > 0 && c.kp === 0) {
        ctx.addIssue({ code: "custom", path: ["controller", "kp"], message: "kp must be above 0 when kd > 0 (the derivative filter uses Td = Kd/Kp)" });
      }
    } else if (degree(c.num) > degree(c.den)) {
      ctx.addIssue({ code: "custom", path: ["controller"], message: "controller must be proper: the degree of num must be at most that of den" });
    }
    if (c.method === "tustin-prewarp") {
      if (c.prewarpHz === undefined || !(c.prewarpHz > 0 && c.prewarpHz < fs / 2)) {
        ctx.addIssue({ code: "custom", path: ["controller", "prewarpHz"], message: `prewarpHz must satisfy 0 < f < sampleRateHz/2 = ${fs / 2} Hz for 'tustin-prewarp'` });
      }
    } else if (c.prewarpHz !== undefined) {
      ctx.addIssue({ code: "custom", path: ["controller", "prewarpHz"], message: "prewarpHz is only used by the 'tustin-prewarp' method" });
    }
    if (m.delaySamples === 0 && degree(m.plant.num) >= degree(m.plant.den)) {
      ctx.addIssue({
        code: "custom",
        path: ["delaySamples"],
        message: "the loop needs at least one sample of delay: make the plant strictly proper (degree of num below that of den) or set delaySamples ≥ 1",
      });
    }
    if (m.filter !== null && m.filter.sampleRateHz !== fs) {
      ctx.addIssue({
        code: "custom",
        path: ["filter", "sampleRateHz"],
        message: `the filter is designed for ${m.filter.sampleRateHz} Hz but the loop runs at ${fs} Hz; coefficients only hold at their own sample rate`,
      });
    }
  });

export type LoopModel = z.infer<typeof loopModelSchema>;
export type PidController = z.infer<typeof pidControllerSchema>;
export type TfController = z.infer<typeof tfControllerSchema>;
export type LoopController = z.infer<typeof controllerSchema>;

/** Validates a loop model; throws one Error listing every refused field path and message. */
export function parseLoopModel(input: unknown): LoopModel {
  const parsed = loopModelSchema.safeParse(input);
  if (!parsed.success) {
    const lines = parsed.error.issues.map((i) => `${i.path.length > 0 ? i.path.join(".") : "(model)"}: ${i.message}`);
    throw new Error(`invalid loop model:\n${lines.join("\n")}`);
  }
  return parsed.data;
}
