import { z } from "zod";

/** How a route is called: no sign-in, the session cookie only, or the cookie or a Bearer token. */
export type ApiAuth = "none" | "session" | "session-or-token";

/** One documented answer: a JSON body (a zod schema), or a file of one or more media types. */
export type ApiResponse =
  | { description: string; json: z.ZodType }
  | { description: string; files: string[] }
  | { description: string };

/** One documented operation, built from the same zod schemas its handler parses with. */
export interface ApiOperation {
  method: "get" | "post" | "delete";
  /** OpenAPI path template, e.g. `/api/v1/revisions/{id}`. */
  path: string;
  operationId: string;
  summary: string;
  description?: string;
  tag: string;
  auth: ApiAuth;
  /** Path parameters: each a zod schema for one segment. */
  path_params?: Record<string, z.ZodType>;
  /** The query schema the handler parses (an object schema; each property becomes a query parameter). */
  query?: z.ZodType;
  /** The JSON body schema the handler parses. */
  body?: z.ZodType;
  responses: Record<number, ApiResponse>;
}

export interface ApiDocumentInput {
  title: string;
  version: string;
  description: string;
  operations: ApiOperation[];
  /** Named schemas (e.g. FilterSpec, Error), each once under components.schemas and referenced wherever they occur. */
  named: Record<string, z.ZodType>;
  sessionCookie: string;
}

type JsonSchema = Record<string, unknown>;

/** One parameter of an operation, as the document holds it. */
export interface ApiParameter {
  name: string;
  in: "path" | "query";
  required: boolean;
  schema: JsonSchema;
}

/** One operation of the document (the parts the API page reads). */
export interface ApiOperationObject {
  operationId: string;
  summary: string;
  description?: string;
  tags: string[];
  security: JsonSchema[];
  parameters?: ApiParameter[];
  requestBody?: { required: true; content: { "application/json": { schema: JsonSchema } } };
  responses: Record<string, { description: string; content?: Record<string, { schema: JsonSchema }> }>;
}

/** The generated OpenAPI 3.1 document. */
export interface ApiDocument {
  openapi: "3.1.0";
  info: { title: string; version: string; description: string };
  paths: Record<string, Partial<Record<ApiOperation["method"], ApiOperationObject>>>;
  components: { schemas: Record<string, JsonSchema>; securitySchemes: Record<string, JsonSchema> };
}

/** A standalone JSON Schema 2020-12 of a zod schema as the client sends it (defaults optional), without `$schema`. */
function inlineSchema(schema: z.ZodType): JsonSchema {
  const { $schema: _s, ...rest } = z.toJSONSchema(schema, { io: "input", unrepresentable: "any" }) as JsonSchema;
  return rest;
}

function parameters(op: ApiOperation): ApiParameter[] {
  const out: ApiParameter[] = Object.entries(op.path_params ?? {}).map(([name, schema]) => ({ name, in: "path", required: true, schema: inlineSchema(schema) }));
  if (op.query) {
    const query = inlineSchema(op.query) as { properties?: Record<string, JsonSchema>; required?: string[] };
    for (const [name, schema] of Object.entries(query.properties ?? {})) {
      out.push({ name, in: "query", required: (query.required ?? []).includes(name), schema });
    }
  }
  return out;
}

/** Components: every named, body and JSON response schema once, under an id; the same zod schema keeps its first id. */
class Components {
  private readonly registry = z.registry<{ id: string }>();
  private readonly ids = new Map<z.ZodType, string>();

  /** A `$ref` to the schema, registering it under `id` the first time it is seen. */
  ref(schema: z.ZodType, id: string): JsonSchema {
    if (!this.ids.has(schema)) {
      this.registry.add(schema, { id });
      this.ids.set(schema, id);
    }
    return { $ref: `#/components/schemas/${this.ids.get(schema)}` };
  }

  /** All registered schemas, converted in one pass so they refer to each other by `$ref` (input side). */
  schemas(): Record<string, JsonSchema> {
    const { schemas } = z.toJSONSchema(this.registry, { io: "input", unrepresentable: "any", uri: (id) => `#/components/schemas/${id}` });
    return Object.fromEntries(
      Object.entries(schemas).map(([id, schema]) => {
        const { $schema: _s, $id: _i, ...rest } = schema as JsonSchema;
        return [id, rest];
      }),
    );
  }
}

const pascal = (id: string) => id.charAt(0).toUpperCase() + id.slice(1);

function responses(op: ApiOperation, components: Components): ApiOperationObject["responses"] {
  return Object.fromEntries(
    Object.entries(op.responses).map(([status, r]) => {
      if ("json" in r) {
        const schema = components.ref(r.json, `${pascal(op.operationId)}${status}`);
        return [status, { description: r.description, content: { "application/json": { schema } } }];
      }
      if ("files" in r) return [status, { description: r.description, content: Object.fromEntries(r.files.map((t) => [t, { schema: { type: "string" } }])) }];
      return [status, { description: r.description }];
    }),
  );
}

const SECURITY: Record<ApiAuth, JsonSchema[]> = {
  none: [],
  session: [{ sessionCookie: [] }],
  "session-or-token": [{ sessionCookie: [] }, { bearerToken: [] }],
};

/**
 * An OpenAPI 3.1 document (JSON Schema 2020-12 dialect, as 3.1 takes) from zod schemas: each named
 * schema once under components.schemas and referenced by `$ref` wherever it occurs, request bodies and
 * query parameters as the handler parses them (input side: a field with a default is optional).
 */
export function openApiDocument(input: ApiDocumentInput): ApiDocument {
  const components = new Components();
  for (const [id, schema] of Object.entries(input.named)) components.ref(schema, id);
  const paths: ApiDocument["paths"] = {};
  for (const op of input.operations) {
    const params = parameters(op);
    paths[op.path] ??= {};
    paths[op.path][op.method] = {
      operationId: op.operationId,
      summary: op.summary,
      ...(op.description ? { description: op.description } : {}),
      tags: [op.tag],
      security: SECURITY[op.auth],
      ...(params.length ? { parameters: params } : {}),
      ...(op.body ? { requestBody: { required: true, content: { "application/json": { schema: components.ref(op.body, `${pascal(op.operationId)}Body`) } } } } : {}),
      responses: responses(op, components),
    };
  }
  return {
    openapi: "3.1.0",
    info: { title: input.title, version: input.version, description: input.description },
    paths,
    components: {
      schemas: components.schemas(),
      securitySchemes: {
        sessionCookie: { type: "apiKey", in: "cookie", name: input.sessionCookie, description: "Set by POST /api/auth/login." },
        bearerToken: { type: "http", scheme: "bearer", description: "An API token (tw_…) from the API tokens page, with its scope." },
      },
    },
  };
}
