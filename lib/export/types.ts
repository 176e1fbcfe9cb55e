import type { FilterDesign, FilterSpec, QuantFormat, QuantizedDesign } from "@/lib/dsp";

/** The export file formats: ours (c-header, json, scipy, csv) and the CMSIS-DSP library's layouts. */
export const EXPORT_FORMATS = ["c-header", "json", "scipy", "csv", "cmsis-df1", "cmsis-df2t"] as const;
export type ExportFormat = (typeof EXPORT_FORMATS)[number];

/** Number formats an export can target (the device formats). */
export const EXPORT_TARGETS = ["f32", "q15", "q31"] as const satisfies readonly QuantFormat[];
export type ExportTarget = (typeof EXPORT_TARGETS)[number];

/** Formats loaded into firmware: refused for unstable designs. scipy arrays and CSV are for analysis. */
export const FIRMWARE_FORMATS: readonly ExportFormat[] = ["c-header", "json", "cmsis-df1", "cmsis-df2t"];

/** The targets each format takes: the library's transposed form II biquad is floating-point only. */
export const FORMAT_TARGETS: Record<ExportFormat, readonly ExportTarget[]> = {
  "c-header": EXPORT_TARGETS,
  json: EXPORT_TARGETS,
  scipy: EXPORT_TARGETS,
  csv: EXPORT_TARGETS,
  "cmsis-df1": ["q15", "q31", "f32"],
  "cmsis-df2t": ["f32"],
};

/** The target of an export when none is asked for: the device's format, or the format's first target when it takes no other. */
export function defaultTarget(format: ExportFormat, deviceFormat: ExportTarget): ExportTarget {
  const allowed = FORMAT_TARGETS[format];
  return allowed.includes(deviceFormat) ? deviceFormat : allowed[0];
}

/** Everything an export needs to know about one revision; the caller reads it from the database. */
export interface ExportSource {
  setId: number;
  setName: string;
  revisionId: number;
  revision: number;
  /** Channel path rig/device/channel the coefficients are for. */
  channel: string;
  spec: FilterSpec;
  design: FilterDesign;
  /** The format the revision was quantized for when saved, and that stored quantized form. */
  storedFormat: ExportTarget;
  storedQuantized: QuantizedDesign | null;
  /** The latest approving review, if any. */
  approval: { by: string; at: Date } | null;
  /** Set for production exports: the active deployment and its checksum (SHA-256 of its channel config entry). */
  deployment?: { id: number; checksum: string };
}

/** A revision's coefficients for one target, checked and ready to render. */
export interface PreparedExport {
  source: ExportSource;
  target: ExportTarget;
  quantized: QuantizedDesign;
  /** Float design and quantized sections both stable. */
  stable: boolean;
  /** Why it is not stable, when it is not. */
  instability?: string;
  /** The hashed coefficient content (see coefficientContent) and its SHA-256, lowercase hex. */
  content: CoefficientContent;
  contentHash: string;
  /** C identifier stem, lowercase, unique per set name, revision and target (e.g. hum_notch_r3_q15). */
  name: string;
  /** The same stem without revision and target (e.g. hum_notch): the stable names of the CMSIS headers' wrappers. */
  stem: string;
  /** Per stage of the content, its index in the spec's stages (0 for a single spec; bypassed stages are not run). */
  specStages: number[];
}

/** One f32 stage of the exported content: sections [b0, b1, b2, a1, a2] as float32 values, or FIR taps. */
export type FloatContentStage = { kind: "sections"; sections: number[][] } | { kind: "fir"; taps: number[] };

/** One Q15/Q31 stage: sections of words [b0, b1, b2, a1, a2] with their post-shifts, or FIR tap words with one post-shift. */
export type FixedContentStage =
  | { kind: "sections"; sections: { words: number[]; shift: number }[] }
  | { kind: "fir"; taps: { words: number[]; shift: number } };

/**
 * The coefficient content an export's hash covers, identical to the JSON export's `coefficients`:
 * every stage of the filter in the order it runs (a single design is one stage).
 */
export type CoefficientContent =
  | { v: 2; format: "f32"; structure: "df2t"; sampleRateHz: number; stages: FloatContentStage[] }
  | { v: 2; format: "q15" | "q31"; structure: "df1"; sampleRateHz: number; stages: FixedContentStage[] };

/** A rendered file, ready to send. */
export interface ExportFile {
  body: string;
  contentType: string;
  filename: string;
}

/** Why a revision cannot be exported as asked; the message is safe to show. */
export class ExportRefusal extends Error {}
