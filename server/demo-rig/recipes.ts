/**
 * What each demo channel carries, in the channel's unit (the invented demo lab of the README):
 * mains pickup at 50 Hz with harmonics, machine tones, a structural resonance (white noise through
 * a band-pass), broadband noise, slow drift, setpoint or load steps, spikes and dropped batches.
 */
export interface Recipe {
  offset: number;
  /** 50 Hz mains pickup: amplitude of the fundamental and of each harmonic 2, 3, … in order. */
  hum?: number[];
  tones?: Array<{ hz: number; amplitude: number }>;
  resonance?: { hz: number; q: number; amplitude: number };
  /** Standard deviation of white noise. */
  noise: number;
  /** Slow sinusoidal drift. */
  drift?: { amplitude: number; periodSeconds: number };
  /** Level changes at random times (mean interval), followed with a first-order lag. */
  steps?: { levels: number[]; meanIntervalSeconds: number; lagSeconds: number };
  spikes?: { perSecond: number; amplitude: number };
  /** Occasional excursions at random times (mean interval): a raised-cosine rise to `amplitude`, a hold, and the same fall. */
  excursions?: { amplitude: number; meanIntervalSeconds: number; riseSeconds: number; holdSeconds: number };
  /** Short rectangular pulses of `amplitude`, `widthMs` long, at random times (mean interval): a pressure spike. */
  pulses?: { amplitude: number; widthMs: number; meanIntervalSeconds: number };
  /** Quantisation step of the sensor (e.g. an encoder). */
  quantum?: number;
  /** Probability that a batch is lost before it reaches the broker. */
  dropProbability: number;
}

export const MAINS_HZ = 50;

export const RECIPES: Record<string, Recipe> = {
  "gearbox-endurance/torque-node/input-torque": {
    offset: 120,
    hum: [6, 0, 2.5],
    tones: [{ hz: 238.5, amplitude: 4 }],
    noise: 1.5,
    steps: { levels: [80, 120, 160, 220], meanIntervalSeconds: 6, lagSeconds: 0.15 },
    dropProbability: 0.002,
  },
  "gearbox-endurance/torque-node/shaft-speed": {
    offset: 1480,
    noise: 0.8,
    drift: { amplitude: 25, periodSeconds: 90 },
    quantum: 2.5,
    dropProbability: 0.001,
  },
  "gearbox-endurance/vibe-node/housing-accel": {
    offset: 0,
    resonance: { hz: 1200, q: 12, amplitude: 9 },
    tones: [{ hz: 407, amplitude: 1.2 }],
    hum: [0.6],
    noise: 1.8,
    spikes: { perSecond: 0.3, amplitude: 25 },
    dropProbability: 0.002,
  },
  "gearbox-endurance/vibe-node/oil-temp": {
    offset: 62,
    noise: 0.05,
    drift: { amplitude: 4, periodSeconds: 600 },
    spikes: { perSecond: 0.05, amplitude: 12 },
    dropProbability: 0.001,
  },
  "hydraulic-press/press-ctl/ram-position": {
    offset: 0,
    noise: 0.08,
    hum: [0.05],
    steps: { levels: [20, 80, 140, 200], meanIntervalSeconds: 4, lagSeconds: 0.08 },
    dropProbability: 0.001,
  },
  "hydraulic-press/press-ctl/line-pressure": {
    offset: 180,
    hum: [1.5, 0.4],
    tones: [{ hz: 225, amplitude: 6 }, { hz: 450, amplitude: 1.5 }],
    noise: 0.9,
    steps: { levels: [0, 25, -15], meanIntervalSeconds: 5, lagSeconds: 0.05 },
    dropProbability: 0.002,
  },
  "hydraulic-press/env-node/frame-strain": {
    offset: 300,
    hum: [35, 0, 9],
    noise: 6,
    drift: { amplitude: 120, periodSeconds: 300 },
    dropProbability: 0.001,
  },
  // Pump ripple at 12 Hz and mains pickup; every couple of minutes an over-pressure excursion of 55 bar that
  // a 240 bar limit catches on any filtered trace, and more than once a minute a 3 ms spike of 80 bar that a
  // 12 Hz notch followed by a 25 Hz low-pass flattens to about 14 bar: the case of a filter hiding a fault.
  "hydraulic-press/supply-node/supply-pressure": {
    offset: 200,
    hum: [3],
    tones: [{ hz: 12, amplitude: 8 }],
    noise: 1.2,
    drift: { amplitude: 4, periodSeconds: 600 },
    excursions: { amplitude: 55, meanIntervalSeconds: 120, riseSeconds: 0.8, holdSeconds: 3 },
    pulses: { amplitude: 80, widthMs: 3, meanIntervalSeconds: 45 },
    dropProbability: 0.001,
  },
  "hydraulic-press/env-node/ambient-temp": {
    offset: 21.5,
    noise: 0.03,
    drift: { amplitude: 1.2, periodSeconds: 900 },
    spikes: { perSecond: 0.02, amplitude: 3 },
    dropProbability: 0.001,
  },
};

/** A plain recipe for channels added to the lab without one. */
export const DEFAULT_RECIPE: Recipe = { offset: 0, hum: [1], noise: 0.5, dropProbability: 0.001 };
