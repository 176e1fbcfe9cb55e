import { db } from "@/db";
import { ping } from "@/db/queries/health";

export const dynamic = "force-dynamic";

export async function GET(): Promise<Response> {
  try {
    await ping(db());
    return Response.json({ status: "ok", db: "up" });
  } catch {
    return new Response("Database unavailable: Tapwright cannot reach PostgreSQL.", {
      status: 503,
      headers: { "content-type": "text/plain; charset=utf-8" },
    });
  }
}
