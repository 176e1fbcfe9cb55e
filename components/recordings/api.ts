import { ApiError } from "@/components/bench/api";
import { decodeSamples } from "@/lib/recordings/samples";

/** A field error from the upload route (path: channel, file, sampleRateHz, name or notes). */
export interface FieldError {
  path: string;
  message: string;
}

async function failure(res: Response): Promise<ApiError> {
  const body = (await res.json().catch(() => null)) as { error?: { message?: string; details?: unknown } } | null;
  const fields = Array.isArray(body?.error?.details) ? (body.error.details as FieldError[]) : [];
  const plain = res.status === 401 ? "Your session has ended. Sign in again." : res.status === 403 ? "Your role may not do this." : `The request failed (HTTP ${res.status}).`;
  return new ApiError(res.status, body?.error?.message ?? plain, fields);
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

/** Uploads a recording form; resolves to the new recording's id. */
export async function uploadRecording(form: FormData): Promise<number> {
  const res = await send("/api/v1/recordings", { method: "POST", body: form });
  return ((await res.json()) as { id: number }).id;
}

/** A recording's samples (float64 little-endian on the wire; NaN for missing). */
export async function fetchSamples(id: number): Promise<Float64Array> {
  const res = await send(`/api/v1/recordings/${id}/samples`);
  return decodeSamples(new Uint8Array(await res.arrayBuffer()));
}

export async function deleteRecording(id: number): Promise<void> {
  await send(`/api/v1/recordings/${id}`, { method: "DELETE" });
}
