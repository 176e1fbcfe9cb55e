import type { FilterSpec } from "@/lib/dsp";

/**
 * The invented demo lab (Cobalt Ridge Test Lab). Fictional rigs, devices and channels;
 * the seed writes them to the database and the demo rig simulator publishes them over MQTT.
 */
export interface DemoChannel {
  key: string;
  name: string;
  unit: string;
  sampleRateHz: number;
  range: [number, number];
  /** What the channel's device runs over a whole filter chain: second-order sections and FIR taps. */
  capacity: { maxSections: number; maxFirTaps: number };
}

export interface DemoDevice {
  key: string;
  name: string;
  coefficientFormat: "f32" | "q15" | "q31";
  channels: DemoChannel[];
}

export interface DemoRig {
  key: string;
  name: string;
  description: string;
  devices: DemoDevice[];
}

export const DEMO_LAB_NAME = "Cobalt Ridge Test Lab";

export const DEMO_RIGS: DemoRig[] = [
  {
    key: "gearbox-endurance",
    name: "Gearbox endurance rig",
    description: "Two-stage gearbox run at cycling load for endurance testing.",
    devices: [
      {
        key: "torque-node",
        name: "Torque node",
        coefficientFormat: "q15",
        channels: [
          { key: "input-torque", name: "Input torque", unit: "N·m", sampleRateHz: 1000, range: [-400, 400], capacity: { maxSections: 16, maxFirTaps: 256 } },
          { key: "shaft-speed", name: "Shaft speed", unit: "rpm", sampleRateHz: 500, range: [0, 3600], capacity: { maxSections: 8, maxFirTaps: 64 } },
        ],
      },
      {
        key: "vibe-node",
        name: "Vibration node",
        coefficientFormat: "f32",
        channels: [
          { key: "housing-accel", name: "Housing acceleration", unit: "m/s²", sampleRateHz: 5000, range: [-50, 50], capacity: { maxSections: 32, maxFirTaps: 512 } },
          { key: "oil-temp", name: "Oil temperature", unit: "°C", sampleRateHz: 100, range: [0, 150], capacity: { maxSections: 8, maxFirTaps: 64 } },
        ],
      },
    ],
  },
  {
    key: "hydraulic-press",
    name: "Hydraulic press",
    description: "Servo-hydraulic press under position control.",
    devices: [
      {
        key: "press-ctl",
        name: "Press controller",
        coefficientFormat: "q31",
        channels: [
          { key: "ram-position", name: "Ram position", unit: "mm", sampleRateHz: 2000, range: [0, 250], capacity: { maxSections: 4, maxFirTaps: 128 } },
          { key: "line-pressure", name: "Line pressure", unit: "bar", sampleRateHz: 2000, range: [0, 350], capacity: { maxSections: 16, maxFirTaps: 256 } },
        ],
      },
      {
        key: "env-node",
        name: "Environment node",
        coefficientFormat: "q15",
        channels: [
          { key: "frame-strain", name: "Frame strain", unit: "µε", sampleRateHz: 1000, range: [-2000, 2000], capacity: { maxSections: 16, maxFirTaps: 256 } },
          { key: "ambient-temp", name: "Ambient temperature", unit: "°C", sampleRateHz: 100, range: [-20, 60], capacity: { maxSections: 8, maxFirTaps: 64 } },
        ],
      },
      {
        key: "supply-node",
        name: "Supply node",
        coefficientFormat: "f32",
        channels: [{ key: "supply-pressure", name: "Supply pressure", unit: "bar", sampleRateHz: 1000, range: [0, 400], capacity: { maxSections: 8, maxFirTaps: 128 } }],
      },
    ],
  },
];

/**
 * The demo's alarm rules, seeded once per channel: the supply pressure's high limit, which the demo
 * rig's occasional excursion crosses on the filtered signal too, and its short pressure spikes cross
 * only on raw once a notch + low-pass chain filters the channel. The 20 bar deadband is more than
 * the pump ripple's swing, so the raw signal does not raise and clear on every ripple near the limit.
 */
export const DEMO_ALARM_RULES = [
  {
    channel: "hydraulic-press/supply-node/supply-pressure",
    name: "Supply pressure high",
    signal: "filtered",
    high: 240,
    low: null,
    deadband: 20,
    minDurationMs: 0,
    severity: "warning",
  },
] as const;

/**
 * The filter `npm start` puts into production on the demo supply pressure, so that the lab shows a
 * filter hiding a fault from the first minutes: the 12 Hz pump-ripple notch followed by a 25 Hz
 * Butterworth low-pass, which flattens the channel's 3 ms spikes below the seeded 240 bar limit.
 */
export const DEMO_PRODUCTION: { channel: string; name: string; notes: string; spec: FilterSpec } = {
  channel: "hydraulic-press/supply-node/supply-pressure",
  name: "Supply pressure: ripple notch and low-pass",
  notes: "Demo: removes the 12 Hz pump ripple and the noise above 25 Hz. It also hides the short pressure spikes; see the Alarms page.",
  spec: {
    kind: "chain",
    sampleRateHz: 1000,
    stages: [
      { kind: "biquad", shape: "notch", centerHz: 12, q: 2, sampleRateHz: 1000 },
      { kind: "iir", family: "butterworth", response: "lowpass", order: 2, cutoffHz: 25, sampleRateHz: 1000 },
    ],
  },
};

export const DEMO_ACCOUNTS = [
  { email: "operator@tapwright.test", displayName: "Demo Operator", role: "operator" },
  { email: "engineer@tapwright.test", displayName: "Demo Engineer", role: "engineer" },
  { email: "lead@tapwright.test", displayName: "Demo Lead", role: "lead" },
  { email: "admin@tapwright.test", displayName: "Demo Admin", role: "admin" },
] as const;
