import { requireUser } from "@/app/_lib/auth";
import { db } from "@/db";
import { findRecording, findRecordingSamples } from "@/db/queries/recordings";
import { AppError } from "@/lib/errors";
import { dbId } from "@/lib/http/fields";
import { handler, parseWith } from "@/lib/http/handler";
import { encodeSamples } from "@/lib/recordings";
import { samplesQuerySchema } from "../../schema";

/**
 * The samples: float64 little-endian bytes by default (application/octet-stream, NaN for missing),
 * or JSON with null for missing when ?format=json or Accept asks for application/json.
 */
export const GET = handler(async (req, ctx: { params: Promise<{ id: string }> }) => {
  const id = parseWith(dbId, (await ctx.params).id);
  const query = parseWith(samplesQuerySchema, Object.fromEntries(new URL(req.url).searchParams));
  await requireUser();
  const recording = await findRecording(db(), id);
  const samples = recording && (await findRecordingSamples(db(), id));
  if (!recording || !samples) throw new AppError("not_found", "No such recording.");
  const json = query.format === "json" || (!query.format && (req.headers.get("accept") ?? "").includes("application/json"));
  const headers = { "x-sample-rate-hz": String(recording.sampleRateHz), "x-sample-count": String(samples.length), "cache-control": "private, max-age=3600" };
  if (json) {
    return Response.json({ sampleRateHz: recording.sampleRateHz, startedAt: recording.startedAt, samples: Array.from(samples, (v) => (Number.isNaN(v) ? null : v)) }, { headers });
  }
  return new Response(encodeSamples(samples), { headers: { ...headers, "content-type": "application/octet-stream" } });
});
