/**
 * Samples as stored: IEEE 754 float64, little-endian, one after another (NaN marks a missing sample).
 * DataView fixes the byte order whatever the machine's own.
 */
export function encodeSamples(samples: Float64Array): Uint8Array<ArrayBuffer> {
  const bytes = new Uint8Array(samples.length * 8);
  const view = new DataView(bytes.buffer);
  for (let i = 0; i < samples.length; i++) view.setFloat64(i * 8, samples[i], true);
  return bytes;
}

/** The inverse of encodeSamples; throws when the byte count is not a multiple of 8. */
export function decodeSamples(bytes: Uint8Array): Float64Array {
  if (bytes.length % 8 !== 0) throw new Error(`stored samples must be a multiple of 8 bytes (got ${bytes.length})`);
  const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  const out = new Float64Array(bytes.length / 8);
  for (let i = 0; i < out.length; i++) out[i] = view.getFloat64(i * 8, true);
  return out;
}
