import { filterSpecSchema } from "@/lib/dsp";
import { SESSION_COOKIE } from "@/lib/auth/session-config";
import { openApiDocument, type ApiDocument } from "@/lib/http/openapi";
import { API_OPERATIONS } from "./operations";
import { errorBody } from "./responses";

/** The OpenAPI 3.1 document of the HTTP API, generated from the handlers' zod schemas (lib/http/openapi.ts). */
export function apiDocument(): ApiDocument {
  return openApiDocument({
    title: "Tapwright HTTP API",
    version: "1",
    description:
      "Coefficient sets, review, promotion and exports of Tapwright. Errors have one shape, `Error`. " +
      "Build pipelines use API tokens (`Authorization: Bearer tw_…`) with the read or promote scope.",
    operations: API_OPERATIONS,
    named: { FilterSpec: filterSpecSchema, Error: errorBody },
    sessionCookie: SESSION_COOKIE,
  });
}
