import { requireUser } from "@/app/_lib/auth";
import { db } from "@/db";
import { findChannelByPath } from "@/db/queries/channels";
import { createRecording, listRecordings } from "@/db/queries/recordings";
import { AppError } from "@/lib/errors";
import { handler, parseWith } from "@/lib/http/handler";
import { parseRecordingCsv, RecordingCsvError } from "@/lib/recordings";
import { listSchema, uploadFieldsSchema } from "./schema";
import { readUpload } from "./upload-body";

export const GET = handler(async (req) => {
  const query = parseWith(listSchema, Object.fromEntries(new URL(req.url).searchParams));
  await requireUser();
  const channel = query.channel ? await findChannelByPath(db(), query.channel) : undefined;
  if (query.channel && !channel) throw new AppError("not_found", `No channel ${query.channel}.`);
  return Response.json(await listRecordings(db(), channel?.id));
});

/** The name field, or else the file's name without `.csv` (at most 120 characters; nothing left means no name). */
function uploadName(field: unknown, fileName: string | null): unknown {
  if (typeof field === "string" && field.trim() !== "") return field;
  const stem = [...(fileName ?? "").replace(/\.csv$/i, "").trim()].slice(0, 120).join("").trim();
  return stem === "" ? undefined : stem;
}

/**
 * Upload: the role is checked before the body is read, so a stranger cannot make the server read
 * 20 MB; then fields → channel → CSV, and one transaction stores the samples with the audit entry.
 */
export const POST = handler(async (req) => {
  const user = await requireUser("engineer");
  const upload = await readUpload(req);
  const fields = parseWith(uploadFieldsSchema, { ...upload.fields, name: uploadName(upload.fields.name, upload.fileName) });
  const channel = await findChannelByPath(db(), fields.channel);
  if (!channel) throw new AppError("not_found", `No channel ${fields.channel}.`, [{ path: "channel", message: "No such channel." }]);
  let parsed;
  try {
    parsed = parseRecordingCsv(upload.csv, { channelRateHz: channel.sampleRateHz, sampleRateHz: fields.sampleRateHz });
  } catch (err) {
    if (!(err instanceof RecordingCsvError)) throw err;
    throw new AppError("unprocessable", err.message, [{ path: err.field, message: err.message, line: err.line, column: err.column }]);
  }
  const name = fields.name ?? `${channel.name} upload`;
  const saved = await db()
    .transaction()
    .execute((trx) =>
      createRecording(trx, user, { channelId: channel.id, name, notes: fields.notes, sampleRateHz: parsed.sampleRateHz, startedAt: parsed.startedAt, samples: parsed.samples, missingCount: parsed.missing }),
    );
  return Response.json({ ...saved, rateSource: parsed.rateSource, time: parsed.time, column: parsed.column }, { status: 201 });
});
