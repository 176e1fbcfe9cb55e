import type { ApiOperationObject } from "@/lib/http/openapi";

const METHOD_STYLE: Record<string, string> = {
  get: "bg-sky-100 text-sky-800 dark:bg-sky-950 dark:text-sky-200",
  post: "bg-amber-100 text-amber-900 dark:bg-amber-950 dark:text-amber-200",
  delete: "bg-slate-200 text-slate-800 dark:bg-slate-800 dark:text-slate-200",
};

const isRecord = (v: unknown): v is Record<string, unknown> => typeof v === "object" && v !== null && !Array.isArray(v);

/** A JSON Schema fragment in one line: its type or $ref name, enum values and default. */
function schemaText(schema: Record<string, unknown>): string {
  const ref = typeof schema.$ref === "string" ? schema.$ref.split("/").pop() : null;
  if (ref) return ref;
  const parts: string[] = [];
  if (Array.isArray(schema.enum)) parts.push(schema.enum.join(" | "));
  else if (typeof schema.type === "string") parts.push(schema.type);
  if (typeof schema.pattern === "string") parts.push(`pattern ${schema.pattern}`);
  if (typeof schema.maximum === "number" && schema.maximum < 1e6) parts.push(`≤ ${schema.maximum}`);
  if (schema.default !== undefined) parts.push(`default ${JSON.stringify(schema.default)}`);
  return parts.join(", ") || "any";
}

const AUTH_TEXT = (security: ApiOperationObject["security"]) =>
  security.length === 0 ? "no sign-in" : security.length === 1 ? "session cookie" : "session cookie or Bearer token";

/** One operation of the OpenAPI document, readable: method and path, summary, who may call it, parameters, body and answers. */
export function OperationCard({ method, path, op, schemas }: { method: string; path: string; op: ApiOperationObject; schemas: Record<string, Record<string, unknown>> }) {
  const ref = op.requestBody?.content["application/json"].schema.$ref;
  const body = typeof ref === "string" ? schemas[ref.split("/").pop() ?? ""] : undefined;
  const props = body?.properties;
  const fields = isRecord(props) ? Object.entries(props).filter((e): e is [string, Record<string, unknown>] => isRecord(e[1])) : [];
  const required = Array.isArray(body?.required) ? body.required : [];
  return (
    <article className="border-t border-slate-200 px-4 py-3 dark:border-slate-800" id={op.operationId} data-testid={`api-op-${op.operationId}`}>
      <h3 className="flex flex-wrap items-center gap-2">
        <span className={`num rounded px-1.5 py-0.5 text-xs font-semibold uppercase ${METHOD_STYLE[method] ?? ""}`}>{method}</span>
        <code className="num text-sm">{path}</code>
        <span className="text-sm text-slate-600 dark:text-slate-300">{op.summary}</span>
      </h3>
      <p className="mt-1 text-xs text-slate-500">
        {AUTH_TEXT(op.security)}
        {op.description ? ` · ${op.description}` : ""}
      </p>
      {op.parameters && op.parameters.length > 0 && (
        <table className="mt-2 w-full text-xs">
          <tbody>
            {op.parameters.map((p) => (
              <tr key={`${p.in}-${p.name}`} className="align-top">
                <td className="num w-40 py-0.5 pr-2">{p.name}</td>
                <td className="w-16 pr-2 text-slate-500">{p.in}{p.required ? ", required" : ""}</td>
                <td className="num break-all">{schemaText(p.schema)}</td>
              </tr>
            ))}
          </tbody>
        </table>
      )}
      {fields.length > 0 && (
        <p className="mt-2 text-xs">
          JSON body:{" "}
          {fields.map(([name, schema], i) => (
            <span key={name}>
              {i > 0 && ", "}
              <code className="num">{name}{required.includes(name) ? "" : "?"}</code> <span className="text-slate-500">({schemaText(schema)})</span>
            </span>
          ))}
        </p>
      )}
      <ul className="mt-2 flex flex-wrap gap-x-4 gap-y-1 text-xs">
        {Object.entries(op.responses).map(([status, r]) => (
          <li key={status}>
            <span className={`num font-semibold ${status.startsWith("2") ? "text-brand-600" : "text-slate-600 dark:text-slate-300"}`}>{status}</span> {r.description}
          </li>
        ))}
      </ul>
    </article>
  );
}
