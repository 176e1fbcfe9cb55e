import { AppError } from "@/lib/errors";

const mb = (bytes: number) => `${(bytes / 1e6).toFixed(1)} MB`;

/** 413 for a body over `limit` bytes, saying how large it was when that is known. */
export function bodyTooLarge(what: string, limit: number, bytes: number | null, path?: string): AppError {
  const size = bytes === null ? "larger than that" : mb(bytes);
  const details = path ? [{ path, message: `At most ${mb(limit)}.` }] : undefined;
  return new AppError("too_large", `${what} may be at most ${mb(limit)}; this one is ${size}.`, details);
}

/**
 * The request body, refused before it is read when Content-Length is over `limit`, and as soon as
 * the bytes read pass it (whatever Content-Length said): memory stays bounded by the limit.
 */
export async function readLimited(req: Request, limit: number, tooLarge: (bytes: number | null) => AppError): Promise<Uint8Array<ArrayBuffer>> {
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

/** Bytes as UTF-8 text; `invalid` is thrown for anything that is not UTF-8. */
export function utf8(bytes: Uint8Array, invalid: () => AppError): string {
  try {
    return new TextDecoder("utf-8", { fatal: true }).decode(bytes);
  } catch {
    throw invalid();
  }
}

/** A JSON body of at most `limit` bytes, parsed; 413 over the limit, 400 when it is not UTF-8 JSON. */
export async function readJson(req: Request, limit: number): Promise<unknown> {
  const bytes = await readLimited(req, limit, (n) => bodyTooLarge("A request body", limit, n));
  const malformed = () => new AppError("bad_request", "The request body must be valid JSON.");
  const text = utf8(bytes, malformed);
  try {
    return JSON.parse(text) as unknown;
  } catch {
    throw malformed();
  }
}
