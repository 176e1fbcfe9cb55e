import type { FilterSpec } from "@/lib/dsp";
import { AppError } from "@/lib/errors";
import { computeForRequest } from "@/lib/workers";
import type { NewRevisionInput } from "@/db/queries/sets";

/**
 * Checks the spec against the channel's sample rate and designs it on a design thread (with the
 * time limit, counted against the user's designs in progress); 422 when it cannot be designed.
 */
export async function revisionInput(
  spec: FilterSpec,
  channel: { path: string; sampleRateHz: number; format: "f32" | "q15" | "q31" },
  notes: string | undefined,
  userId: number,
): Promise<NewRevisionInput> {
  if (spec.sampleRateHz !== channel.sampleRateHz) {
    throw new AppError(
      "unprocessable",
      `spec.sampleRateHz is ${spec.sampleRateHz} Hz but ${channel.path} samples at ${channel.sampleRateHz} Hz; coefficients are specific to one sample rate.`,
    );
  }
  const job = { kind: "revision-content", spec, format: channel.format } as const;
  const content = await computeForRequest(job, `user:${userId}`, "The filter could not be designed");
  return { spec, content, notes: notes ?? "", format: channel.format, sampleRateHz: channel.sampleRateHz };
}
