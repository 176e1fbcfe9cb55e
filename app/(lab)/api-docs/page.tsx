import type { Metadata } from "next";
import Link from "next/link";
import { requirePageUser } from "@/app/_lib/auth";
import { apiDocument } from "@/app/api/v1/openapi.json/document";
import { OperationCard } from "@/components/api-docs/operation-card";
import { WorkedExample } from "@/components/api-docs/worked-example";
import { TOKEN_RATE } from "@/lib/auth/token-scope";
import { appUrl, env } from "@/lib/env";

export const metadata: Metadata = { title: "HTTP API" };

/** The HTTP API, rendered from the same OpenAPI document that /api/v1/openapi.json serves, with a worked firmware example. */
export default async function ApiDocsPage() {
  await requirePageUser("operator");
  const doc = apiDocument();
  const ops = Object.entries(doc.paths).flatMap(([path, methods]) =>
    Object.entries(methods).flatMap(([method, op]) => (op ? [{ path, method, op }] : [])),
  );
  const tags = [...new Set(ops.map((o) => o.op.tags[0]))];
  return (
    <div className="space-y-6">
      <section className="card space-y-2 p-4">
        <h1 className="text-lg font-semibold">HTTP API</h1>
        <p className="text-sm text-slate-600 dark:text-slate-300">
          {doc.info.description} The machine-readable form is{" "}
          <a className="underline" href="/api/v1/openapi.json" data-testid="openapi-link">/api/v1/openapi.json</a> (OpenAPI 3.1, generated from the
          same schemas the server checks requests with).
        </p>
        <ul className="list-disc pl-5 text-sm text-slate-600 dark:text-slate-300">
          <li>Sign in with the session cookie (<code className="num text-xs">POST /api/auth/login</code>), or send <code className="num text-xs">Authorization: Bearer tw_…</code> from the <Link href="/tokens" className="underline">API tokens</Link> page.</li>
          <li><b>read</b> tokens export and read; <b>promote</b> tokens (created by leads) may also request promotions, and every use of one is audited with its name. A token acts with its owner&apos;s current role, makes at most {TOKEN_RATE.maxPerWindow} requests a minute, and stops for good when its owner is disabled.</li>
          <li>Errors have one shape: <code className="num text-xs">{`{"error": {"code", "message", "details?"}}`}</code>.</li>
        </ul>
      </section>
      <WorkedExample origin={appUrl(env())} />
      {tags.map((tag) => (
        <section key={tag} className="card" data-testid={`api-tag-${tag}`}>
          <h2 className="px-4 py-3 font-semibold capitalize">{tag}</h2>
          {ops.filter((o) => o.op.tags[0] === tag).map((o) => <OperationCard key={`${o.method} ${o.path}`} method={o.method} path={o.path} op={o.op} schemas={doc.components.schemas} />)}
        </section>
      ))}
    </div>
  );
}
