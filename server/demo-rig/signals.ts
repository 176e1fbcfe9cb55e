import { createStreamingFilter, designFilter, type StreamingFilter } from "@/lib/dsp";
import { MAINS_HZ, type Recipe } from "./recipes";
import { gaussian, mulberry32 } from "./prng";

/** An endless, deterministic sample stream for one channel. */
export interface SignalSource {
  /** The next n samples. */
  next(n: number): Float64Array;
  /** Whether the next batch is lost (drawn from the same seeded stream). */
  dropNext(): boolean;
}

/** Builds a channel's stream from its recipe; the same seed gives the same samples. */
export function createSignalSource(recipe: Recipe, sampleRateHz: number, seed: number): SignalSource {
  const uniform = mulberry32(seed);
  const normal = gaussian(uniform);
  const resonator: StreamingFilter | null = recipe.resonance
    ? createStreamingFilter(
        designFilter({
          kind: "biquad",
          shape: "bandpass",
          centerHz: Math.min(recipe.resonance.hz, sampleRateHz * 0.45),
          q: recipe.resonance.q,
          sampleRateHz,
        }),
      )
    : null;
  const dt = 1 / sampleRateHz;
  let n = 0;
  let level = recipe.steps?.levels[0] ?? 0;
  let target = level;
  const stepChance = recipe.steps ? dt / recipe.steps.meanIntervalSeconds : 0;
  const lagAlpha = recipe.steps ? 1 - Math.exp(-dt / recipe.steps.lagSeconds) : 1;
  const spikeChance = recipe.spikes ? recipe.spikes.perSecond * dt : 0;
  const excursion = recipe.excursions ? excursionShape(recipe.excursions, uniform, dt) : null;
  const pulse = recipe.pulses ? pulseShape(recipe.pulses, uniform, dt) : null;

  function sample(): number {
    const t = n++ * dt;
    let v = recipe.offset + recipe.noise * normal();
    recipe.hum?.forEach((a, k) => (v += a * Math.sin(2 * Math.PI * MAINS_HZ * (k + 1) * t + k)));
    for (const tone of recipe.tones ?? []) v += tone.amplitude * Math.sin(2 * Math.PI * tone.hz * t);
    if (recipe.drift) v += recipe.drift.amplitude * Math.sin((2 * Math.PI * t) / recipe.drift.periodSeconds);
    if (recipe.steps) {
      if (uniform() < stepChance) target = recipe.steps.levels[Math.floor(uniform() * recipe.steps.levels.length)];
      level += lagAlpha * (target - level);
      v += level;
    }
    if (recipe.spikes && uniform() < spikeChance) v += recipe.spikes.amplitude * (uniform() < 0.5 ? -1 : 1);
    if (excursion) v += excursion();
    if (pulse) v += pulse();
    return v;
  }

  return {
    next(count) {
      const out = new Float64Array(count);
      for (let i = 0; i < count; i++) out[i] = sample();
      if (resonator && recipe.resonance) {
        const excitation = Float64Array.from({ length: count }, () => normal() * recipe.resonance!.amplitude);
        const ringing = resonator.process(excitation);
        for (let i = 0; i < count; i++) out[i] += ringing[i];
      }
      if (recipe.quantum) for (let i = 0; i < count; i++) out[i] = Math.round(out[i] / recipe.quantum) * recipe.quantum;
      return out;
    },
    dropNext: () => uniform() < recipe.dropProbability,
  };
}

/**
 * An excursion's offset sample by sample: idle until a random start (chance dt / mean interval per
 * sample), then a raised-cosine rise, a hold at the amplitude and a raised-cosine fall.
 */
function excursionShape(e: NonNullable<Recipe["excursions"]>, uniform: () => number, dt: number): () => number {
  const chance = dt / e.meanIntervalSeconds;
  const total = 2 * e.riseSeconds + e.holdSeconds;
  let age: number | null = null;
  return () => {
    if (age === null) {
      if (uniform() >= chance) return 0;
      age = 0;
    }
    const t = age;
    age += dt;
    if (age >= total) age = null;
    if (t < e.riseSeconds) return e.amplitude * 0.5 * (1 - Math.cos((Math.PI * t) / e.riseSeconds));
    if (t < e.riseSeconds + e.holdSeconds) return e.amplitude;
    return e.amplitude * 0.5 * (1 + Math.cos((Math.PI * (t - e.riseSeconds - e.holdSeconds)) / e.riseSeconds));
  };
}

/** A pulse's offset sample by sample: `amplitude` for widthMs from a random start (chance dt / mean interval per sample). */
function pulseShape(p: NonNullable<Recipe["pulses"]>, uniform: () => number, dt: number): () => number {
  const chance = dt / p.meanIntervalSeconds;
  const width = Math.max(1, Math.round(p.widthMs / 1000 / dt));
  let left = 0;
  return () => {
    if (left === 0 && uniform() < chance) left = width;
    if (left === 0) return 0;
    left--;
    return p.amplitude;
  };
}
