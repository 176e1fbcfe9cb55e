import { AppError } from "@/lib/errors";
import { MAX_UPLOAD_BYTES } from "@/lib/recordings";

/** Room for multipart boundaries and the small text fields around the file, in bytes. */
const FORM_OVERHEAD_BYTES = 64_000;

const mb = (bytes: number) => `${(bytes / 1e6).toFixed(1)} MB`;

const tooLarge = (bytes: number | null) =>
  new AppError("bad_request", `The upload is ${bytes === null ? "larger than the limit" : mb(bytes)}; one recording may be at most ${mb(MAX_UPLOAD_BYTES)}. Split the capture into shorter files.`, [
    { path: "file", message: `At most ${mb(MAX_UPLOAD_BYTES)} per file.` },
  ]);

/** The request body, refused with 400 as soon as it grows past `limit` bytes (whatever Content-Length says). */
async function readLimited(req: Request, limit: number): Promise<Uint8Array<ArrayBuffer>> {
  const declared = Number(req.headers.get("content-length"));
  if (declared > limit) throw tooLarge(declared);
  const reader = req.body?.getReader();
  const chunks: Uint8Array[] = [];
  let total = 0;
  for (;;) {
    const next = await reader?.read();
    if (!next || next.done) break;
    total += next.value.length;
    if (total > limit) {
      await reader?.cancel();
      throw tooLarge(null);
    }
    chunks.push(next.value);
  }
  const out = new Uint8Array(total);
  let at = 0;
  for (const c of chunks) {
    out.set(c, at);
    at += c.length;
  }
  return out;
}

function utf8(bytes: Uint8Array): string {
  try {
    return new TextDecoder("utf-8", { fatal: true }).decode(bytes);
  } catch {
    throw new AppError("unprocessable", "The file is not UTF-8 text. Save the CSV as UTF-8.", [{ path: "file", message: "Save the CSV as UTF-8." }]);
  }
}

/** The CSV text, the upload fields and the file's name, from a multipart form or a text/csv body with the fields in the query. */
export async function readUpload(req: Request): Promise<{ csv: string; fields: Record<string, unknown>; fileName: string | null }> {
  const type = req.headers.get("content-type") ?? "";
  if (type.startsWith("multipart/form-data")) {
    const bytes = await readLimited(req, MAX_UPLOAD_BYTES + FORM_OVERHEAD_BYTES);
    const form = await new Response(bytes, { headers: { "content-type": type } }).formData().catch(() => {
      throw new AppError("bad_request", "The form could not be read. Send it as multipart/form-data.");
    });
    const file = form.get("file");
    if (!(file instanceof Blob)) throw new AppError("bad_request", "Choose a CSV file to upload.", [{ path: "file", message: "Choose a CSV file." }]);
    if (file.size > MAX_UPLOAD_BYTES) throw tooLarge(file.size);
    const fields = Object.fromEntries([...form.entries()].filter(([k, v]) => k !== "file" && typeof v === "string"));
    return { csv: utf8(new Uint8Array(await file.arrayBuffer())), fields, fileName: file instanceof File ? file.name : null };
  }
  if (type.startsWith("text/csv")) {
    const bytes = await readLimited(req, MAX_UPLOAD_BYTES);
    return { csv: utf8(bytes), fields: Object.fromEntries(new URL(req.url).searchParams), fileName: null };
  }
  throw new AppError("bad_request", "Send the recording as multipart/form-data (with a file field) or as a text/csv body with the fields in the query string.");
}
