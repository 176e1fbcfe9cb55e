import { sql } from "kysely";
import { db } from "@/db";

export const dynamic = "force-dynamic";

export async function GET(): Promise<Response> {
  try {
    await sql`select 1`.execute(db());
    return Response.json({ status: "ok", db: "up" });
  } catch {
    return new Response("Database unavailable: Tapwright cannot reach PostgreSQL.", {
      status: 503,
      headers: { "content-type": "text/plain; charset=utf-8" },
    });
  }
}
