import { zpk2sos, type FilterDesign } from "@/lib/dsp";

/** Most sections one channel of a device configuration carries (lib/protocol channelConfigSchema). */
export const MAX_DEVICE_SECTIONS = 64;

/**
 * The design as second-order sections, the only form a device runs: SOS designs as they are, FIR
 * designs factored from their zeros (poles at the origin) with zpk2sos, which pairs them as scipy
 * does. Throws naming the limit when more than MAX_DEVICE_SECTIONS sections would be needed.
 */
export function sectionsDesign(design: FilterDesign): FilterDesign {
  if (design.sos) return checkCount(design, design.sos.length);
  const sos = zpk2sos(design.zeros, design.poles, design.gain);
  checkCount(design, sos.length);
  return { ...design, sos, taps: undefined };
}

function checkCount(design: FilterDesign, n: number): FilterDesign {
  if (n > MAX_DEVICE_SECTIONS) {
    throw new Error(`a device runs at most ${MAX_DEVICE_SECTIONS} second-order sections; this design needs ${n}`);
  }
  return design;
}
