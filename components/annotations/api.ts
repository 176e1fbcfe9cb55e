import { z } from "zod";
import { request } from "@/components/bench/api";
import { queryString } from "@/lib/alarms/view";
import { channelPathSchema } from "@/lib/protocol";

const time = z.iso.datetime({ offset: true });

export const annotationSchema = z.object({
  id: z.number().int(),
  channel: channelPathSchema,
  at: time,
  endAt: time.nullable(),
  text: z.string(),
  createdBy: z.number().int(),
  authorName: z.string(),
  createdAt: time,
});
export type Annotation = z.infer<typeof annotationSchema>;

export interface AnnotationQuery {
  channel?: string;
  q?: string;
  /** ISO times. */
  from?: string;
  to?: string;
  limit?: number;
}

export async function fetchAnnotations(query: AnnotationQuery): Promise<Annotation[]> {
  return z.array(annotationSchema).parse(await request<unknown>(`/api/v1/annotations${queryString(query)}`));
}

export async function createAnnotation(input: { channel: string; at: string; endAt: string | null; text: string }): Promise<Annotation> {
  return annotationSchema.parse(await request<unknown>("/api/v1/annotations", { method: "POST", body: JSON.stringify(input) }));
}

export async function deleteAnnotation(id: number): Promise<void> {
  await request<unknown>(`/api/v1/annotations/${id}`, { method: "DELETE" });
}
