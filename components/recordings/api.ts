import { ApiError } from "@/components/bench/api";
import { decodeSamples } from "@/lib/recordings/samples";

/** A field error from the upload route (path: channel, file, sampleRateHz, name or notes). */
export interface FieldError {
  path: string;
  message: string;
}

async function failure(res: Response): Promise<ApiError> {
  return failureFrom(res.status, await res.json().catch(() => null));
}

/** The error a refused request stands for, from its status and its JSON body (the documented error shape). */
function failureFrom(status: number, json: unknown): ApiError {
  const body = json as { error?: { message?: string; details?: unknown } } | null;
  const fields = Array.isArray(body?.error?.details) ? (body.error.details as FieldError[]) : [];
  const plain = status === 401 ? "Your session has ended. Sign in again." : status === 403 ? "Your role may not do this." : `The request failed (HTTP ${status}).`;
  return new ApiError(status, body?.error?.message ?? plain, fields);
}

async function send(url: string, init?: RequestInit): Promise<Response> {
  try {
    const res = await fetch(url, { ...init, credentials: "same-origin" });
    if (!res.ok) throw await failure(res);
    return res;
  } catch (err) {
    if (err instanceof ApiError) throw err;
    throw new ApiError(0, "The server did not answer. Check the connection and try again.");
  }
}

/** Bytes of the request body sent so far, and the body's size. */
export interface UploadProgress {
  sent: number;
  total: number;
}

/** Thrown when the person cancels an upload. */
export class UploadCancelled extends Error {}

/**
 * Uploads a recording form; resolves to the new recording's id. XMLHttpRequest rather than fetch,
 * because only it reports the bytes of the body as they leave (upload progress events).
 */
export function uploadRecording(form: FormData, opts: { onProgress?: (p: UploadProgress) => void; signal?: AbortSignal } = {}): Promise<number> {
  return new Promise<number>((resolve, reject) => {
    const xhr = new XMLHttpRequest();
    xhr.open("POST", "/api/v1/recordings");
    xhr.withCredentials = true;
    xhr.responseType = "json";
    xhr.upload.onprogress = (e) => opts.onProgress?.({ sent: e.loaded, total: e.lengthComputable ? e.total : 0 });
    xhr.onload = () => {
      const body: unknown = xhr.response;
      if (xhr.status >= 200 && xhr.status < 300) {
        const id = body !== null && typeof body === "object" && "id" in body && typeof body.id === "number" ? body.id : NaN;
        return Number.isInteger(id) ? resolve(id) : reject(new ApiError(xhr.status, "The server's answer did not name the new recording."));
      }
      reject(failureFrom(xhr.status, body));
    };
    xhr.onerror = () => reject(new ApiError(0, "The server did not answer. Check the connection and try again."));
    xhr.onabort = () => reject(new UploadCancelled("Upload cancelled; nothing was stored."));
    opts.signal?.addEventListener("abort", () => xhr.abort(), { once: true });
    xhr.send(form);
  });
}

/** A recording's samples (float64 little-endian on the wire; NaN for missing). */
export async function fetchSamples(id: number): Promise<Float64Array> {
  const res = await send(`/api/v1/recordings/${id}/samples`);
  return decodeSamples(new Uint8Array(await res.arrayBuffer()));
}

export async function deleteRecording(id: number): Promise<void> {
  await send(`/api/v1/recordings/${id}`, { method: "DELETE" });
}
