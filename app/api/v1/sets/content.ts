import { buildRevisionContent } from "@/lib/coefficients";
import type { FilterSpec } from "@/lib/dsp";
import { AppError } from "@/lib/errors";
import type { NewRevisionInput } from "@/db/queries/sets";

/** Checks the spec against the channel's sample rate and designs it on the server; 422 when it cannot be designed. */
export function revisionInput(
  spec: FilterSpec,
  channel: { path: string; sampleRateHz: number; format: "f32" | "q15" | "q31" },
  notes: string | undefined,
): NewRevisionInput {
  if (spec.sampleRateHz !== channel.sampleRateHz) {
    throw new AppError(
      "unprocessable",
      `spec.sampleRateHz is ${spec.sampleRateHz} Hz but ${channel.path} samples at ${channel.sampleRateHz} Hz; coefficients are specific to one sample rate.`,
    );
  }
  try {
    const content = buildRevisionContent(spec, channel.format);
    return { spec, content, notes: notes ?? "", format: channel.format, sampleRateHz: channel.sampleRateHz };
  } catch (err) {
    throw new AppError("unprocessable", `The filter could not be designed: ${(err as Error).message}`);
  }
}
