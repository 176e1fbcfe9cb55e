import { z } from "zod";
import type { FaultKind } from "./faults";
import { allFinite } from "./finite";
import { Slab } from "./slab";

/** Largest sample payload accepted, in bytes; larger ones are refused unread. */
export const MAX_PAYLOAD_BYTES = 64 * 1024;

/** Binary sample payload v1, little-endian (docs/protocol.md has the table). */
export const BINARY_MAGIC = 0x54; // "T"
export const BINARY_VERSION = 1;
export const BINARY_HEADER_BYTES = 28;
/** Most values one message may carry (binary: what fits under MAX_PAYLOAD_BYTES; JSON uses the same bound). */
export const MAX_VALUES = Math.floor((MAX_PAYLOAD_BYTES - BINARY_HEADER_BYTES) / 4);

/** One batch of evenly spaced samples: sample i was taken at t0 + i·1000/sampleRateHz ms. */
export interface SampleBatch {
  /** Per-channel message counter, uint32, +1 per message (wraps at 2^32). */
  seq: number;
  /** Time of values[0], Unix epoch milliseconds. */
  t0: number;
  sampleRateHz: number;
  values: Float64Array;
}

export type DecodeResult = { ok: true; batch: SampleBatch } | { ok: false; fault: FaultKind };

/** JSON sample payload v1: `{"seq": n, "t0": ms, "sampleRateHz": fs, "values": [...]}`. */
export const jsonSamplesSchema = z
  .object({
    seq: z.number().int().min(0).max(0xffffffff),
    t0: z.number(),
    sampleRateHz: z.number().positive(),
    values: z.array(z.number()),
  })
  .strict();

export type JsonSamples = z.infer<typeof jsonSamplesSchema>;

/** Encodes a batch as the binary v1 layout (values stored as float32). */
export function encodeBinarySamples(batch: { seq: number; t0: number; sampleRateHz: number; values: ArrayLike<number> }): Uint8Array {
  const count = batch.values.length;
  if (count < 1 || count > MAX_VALUES) throw new Error(`values must hold 1 to ${MAX_VALUES} samples (got ${count})`);
  const bytes = new Uint8Array(BINARY_HEADER_BYTES + 4 * count);
  const view = new DataView(bytes.buffer);
  view.setUint8(0, BINARY_MAGIC);
  view.setUint8(1, BINARY_VERSION);
  view.setUint32(4, batch.seq >>> 0, true);
  view.setFloat64(8, batch.t0, true);
  view.setFloat64(16, batch.sampleRateHz, true);
  view.setUint16(24, count, true);
  for (let i = 0; i < count; i++) view.setFloat32(BINARY_HEADER_BYTES + 4 * i, batch.values[i], true);
  return bytes;
}

/** Decoded values come from shared buffers: one message's few hundred bytes need no buffer of their own. */
const valuesSlab = new Slab();

/** Reads the binary v1 layout through a DataView on the payload's own bytes; allocates only the output. */
export function decodeBinarySamples(payload: Uint8Array): DecodeResult {
  if (payload.byteLength < BINARY_HEADER_BYTES) return { ok: false, fault: "bad_length" };
  const view = new DataView(payload.buffer, payload.byteOffset, payload.byteLength);
  if (view.getUint8(0) !== BINARY_MAGIC || view.getUint8(1) !== BINARY_VERSION) return { ok: false, fault: "bad_binary" };
  if (view.getUint8(2) !== 0 || view.getUint8(3) !== 0) return { ok: false, fault: "bad_binary" };
  const count = view.getUint16(24, true);
  if (count === 0 || payload.byteLength !== BINARY_HEADER_BYTES + 4 * count) return { ok: false, fault: "bad_length" };
  const t0 = view.getFloat64(8, true);
  const sampleRateHz = view.getFloat64(16, true);
  if (!Number.isFinite(t0) || !(sampleRateHz > 0 && Number.isFinite(sampleRateHz))) return { ok: false, fault: "bad_shape" };
  const values = valuesSlab.float64(count);
  for (let i = 0; i < count; i++) values[i] = view.getFloat32(BINARY_HEADER_BYTES + 4 * i, true);
  if (!allFinite(values)) return { ok: false, fault: "non_finite" };
  return { ok: true, batch: { seq: view.getUint32(4, true), t0, sampleRateHz, values } };
}

const utf8 = new TextDecoder("utf-8", { fatal: true });

/** Reads the JSON v1 payload; a value written as 1e999 parses to Infinity and counts as non_finite. */
export function decodeJsonSamples(payload: Uint8Array): DecodeResult {
  let raw: unknown;
  try {
    raw = JSON.parse(utf8.decode(payload));
  } catch {
    return { ok: false, fault: "bad_json" };
  }
  const values = (raw as { values?: unknown } | null)?.values;
  if (Array.isArray(values)) {
    if (values.length === 0 || values.length > MAX_VALUES) return { ok: false, fault: "bad_length" };
    if (values.some((v) => typeof v === "number" && !Number.isFinite(v))) return { ok: false, fault: "non_finite" };
  }
  const parsed = jsonSamplesSchema.safeParse(raw);
  if (!parsed.success) return { ok: false, fault: "bad_shape" };
  const { seq, t0, sampleRateHz } = parsed.data;
  return { ok: true, batch: { seq, t0, sampleRateHz, values: Float64Array.from(parsed.data.values) } };
}

/** Decodes either form: a payload starting with the binary magic is binary, anything else JSON. */
export function decodeSamples(payload: Uint8Array): DecodeResult {
  if (payload.byteLength > MAX_PAYLOAD_BYTES) return { ok: false, fault: "oversized" };
  return payload[0] === BINARY_MAGIC ? decodeBinarySamples(payload) : decodeJsonSamples(payload);
}
