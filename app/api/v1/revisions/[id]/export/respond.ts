import { db } from "@/db";
import { listReviews, type RevisionView } from "@/db/queries/revisions";
import { AppError } from "@/lib/errors";
import { defaultTarget, ExportRefusal, renderExport, type ExportSource, type ExportTarget } from "@/lib/export";
import { computeForRequest } from "@/lib/workers";
import type { SessionUser } from "@/lib/auth/guard";
import type { ExportQuery } from "./schema";

/** An export source for a stored revision, with its latest approval. */
export async function revisionSource(rev: RevisionView, channel = rev.channel): Promise<ExportSource> {
  const approved = (await listReviews(db(), rev.setId)).find((r) => r.revisionId === rev.id && r.decision === "approved");
  return {
    setId: rev.setId,
    setName: rev.setName,
    revisionId: rev.id,
    revision: rev.revision,
    channel,
    spec: rev.spec,
    design: rev.design,
    storedFormat: rev.format,
    storedQuantized: rev.quantized,
    approval: approved ? { by: approved.reviewer, at: approved.at } : null,
  };
}

/**
 * Renders the export as a download; quantizing for the target runs on a design thread (with its time
 * limit). A refusal (unstable, cannot quantize) is a 422 with the reason.
 */
export async function exportResponse(source: ExportSource, query: ExportQuery, deviceFormat: ExportTarget, caller: SessionUser): Promise<Response> {
  try {
    const job = { kind: "export", source, target: query.target ?? defaultTarget(query.format, deviceFormat), prefix: query.prefix } as const;
    const prepared = await computeForRequest(job, `user:${caller.id}`, "The export could not be prepared");
    const file = renderExport(prepared, query.format);
    return new Response(file.body, {
      headers: {
        "content-type": file.contentType,
        "content-disposition": `attachment; filename="${file.filename}"`,
        "cache-control": "no-store",
        "x-content-sha256": prepared.contentHash,
      },
    });
  } catch (err) {
    if (err instanceof ExportRefusal) throw new AppError("unprocessable", err.message);
    throw err;
  }
}
