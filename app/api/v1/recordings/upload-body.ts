import { AppError } from "@/lib/errors";
import { bodyTooLarge, readLimited, utf8 } from "@/lib/http/body";
import { MAX_UPLOAD_BYTES } from "@/lib/recordings";

/** Room for multipart boundaries and the small text fields around the file, in bytes. */
const FORM_OVERHEAD_BYTES = 64_000;

const tooLarge = (bytes: number | null) => bodyTooLarge("One recording", MAX_UPLOAD_BYTES, bytes, "file");

const notUtf8 = () => new AppError("unprocessable", "The file is not UTF-8 text. Save the CSV as UTF-8.", [{ path: "file", message: "Save the CSV as UTF-8." }]);

/** The CSV text, the upload fields and the file's name, from a multipart form or a text/csv body with the fields in the query. */
export async function readUpload(req: Request): Promise<{ csv: string; fields: Record<string, unknown>; fileName: string | null }> {
  const type = req.headers.get("content-type") ?? "";
  if (type.startsWith("multipart/form-data")) {
    const bytes = await readLimited(req, MAX_UPLOAD_BYTES + FORM_OVERHEAD_BYTES, tooLarge);
    const form = await new Response(bytes, { headers: { "content-type": type } }).formData().catch(() => {
      throw new AppError("bad_request", "The form could not be read. Send it as multipart/form-data.");
    });
    const file = form.get("file");
    if (!(file instanceof Blob)) throw new AppError("bad_request", "Choose a CSV file to upload.", [{ path: "file", message: "Choose a CSV file." }]);
    if (file.size > MAX_UPLOAD_BYTES) throw tooLarge(file.size);
    const fields = Object.fromEntries([...form.entries()].filter(([k, v]) => k !== "file" && typeof v === "string"));
    return { csv: utf8(new Uint8Array(await file.arrayBuffer()), notUtf8), fields, fileName: file instanceof File ? file.name : null };
  }
  if (type.startsWith("text/csv")) {
    const bytes = await readLimited(req, MAX_UPLOAD_BYTES, tooLarge);
    return { csv: utf8(bytes, notUtf8), fields: Object.fromEntries(new URL(req.url).searchParams), fileName: null };
  }
  throw new AppError("bad_request", "Send the recording as multipart/form-data (with a file field) or as a text/csv body with the fields in the query string.");
}
