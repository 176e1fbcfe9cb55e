import { DIFFERENCE_EQUATION } from "./describe";
import type { PreparedExport } from "./types";

/**
 * The JSON export (v2): the header's fields for devices that take coefficients at run time.
 * `coefficients` is exactly the object `contentHash` covers (SHA-256 of its RFC 8785 canonical JSON);
 * `specStages` gives, per stage of it, the index of its stage in the spec.
 */
export function renderJson(p: PreparedExport): string {
  const s = p.source;
  const doc = {
    kind: "tapwright.coefficients",
    v: 2,
    name: p.name,
    set: { id: s.setId, name: s.setName },
    revision: { id: s.revisionId, number: s.revision },
    channel: s.channel,
    sampleRateHz: p.quantized.sampleRateHz,
    target: p.target,
    structure: p.content.structure,
    ...(p.target === "f32" ? {} : { fractionBits: p.target === "q15" ? 15 : 31, accumulatorBits: 64 }),
    signConvention: {
      equation: DIFFERENCE_EQUATION,
      order: ["b0", "b1", "b2", "a1", "a2"],
      feedbackNegated: false,
      note: "a1 and a2 are stored as in the equation (subtracted); a0 = 1 is not stored. FIR taps run h0 (newest input) first.",
    },
    approval: s.approval ? { by: s.approval.by, at: s.approval.at.toISOString() } : null,
    ...(s.deployment ? { deployment: s.deployment } : {}),
    stable: p.stable,
    spec: s.spec,
    specStages: p.specStages,
    contentHash: p.contentHash,
    coefficients: p.content,
  };
  return `${JSON.stringify(doc, null, 2)}\n`;
}
