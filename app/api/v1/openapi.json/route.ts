import { handler } from "@/lib/http/handler";
import { apiDocument } from "./document";

/** GET /api/v1/openapi.json — the OpenAPI 3.1 document; public, like the API page. */
export const GET = handler(async () => Response.json(apiDocument(), { headers: { "cache-control": "no-cache" } }));
