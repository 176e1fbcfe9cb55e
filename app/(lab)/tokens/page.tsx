import type { Metadata } from "next";
import Link from "next/link";
import { requirePageUser } from "@/app/_lib/auth";
import { TokenCreateForm } from "@/components/export/token-create-form";
import { ActionForm } from "@/components/sets/action-form";
import { db } from "@/db";
import { listTokens } from "@/db/queries/tokens";
import { roleAtLeast } from "@/lib/auth/roles";
import { TOKEN_RATE } from "@/lib/auth/token-scope";
import { createTokenAction, revokeTokenAction } from "./actions";
import { formatDateTime } from "@/lib/format/date-time";

export const metadata: Metadata = { title: "API tokens" };


export default async function TokensPage() {
  const me = await requirePageUser("engineer");
  const tokens = await listTokens(db(), me);
  const everyone = roleAtLeast(me.role, "lead");
  return (
    <div className="grid gap-6 lg:grid-cols-[1fr_22rem]">
      <section className="card overflow-x-auto">
        <h1 className="border-b border-slate-200 px-4 py-3 text-lg font-semibold dark:border-slate-800">API tokens</h1>
        <p className="px-4 pt-3 text-sm text-slate-600 dark:text-slate-300">
          Build pipelines fetch coefficient exports with a token: <code className="num text-xs">GET /api/v1/revisions/&lt;id&gt;/export?format=c-header</code> or{" "}
          <code className="num text-xs">/api/v1/channels/&lt;rig&gt;/&lt;device&gt;/&lt;channel&gt;/production/export</code> (every route and a worked
          example on the <Link href="/api-docs" className="underline">API page</Link>). A <b>read</b> token exports and reads; a <b>promote</b> token
          (leads only) may also request promotions, and every use of one is audited with its name. A token acts with its owner&apos;s role, at most{" "}
          {TOKEN_RATE.maxPerWindow} requests a minute, and stops for good when its owner is disabled.
          {everyone ? " You see everyone's tokens." : " You see your own tokens."}
        </p>
        {tokens.length === 0 ? (
          <p className="px-4 py-3 text-sm text-slate-500">No tokens yet. Create one for each pipeline, so each can be revoked alone.</p>
        ) : (
          <table className="mt-2 w-full text-sm" data-testid="token-list">
            <thead className="text-left text-xs uppercase tracking-wide text-slate-500">
              <tr>
                <th className="px-4 py-2">Name</th>
                {everyone && <th className="px-4 py-2">Owner</th>}
                <th className="px-4 py-2">Scope</th>
                <th className="px-4 py-2">Created</th>
                <th className="px-4 py-2">Last used</th>
                <th className="px-4 py-2">State</th>
              </tr>
            </thead>
            <tbody>
              {tokens.map((t) => (
                <tr key={t.id} className="border-t border-slate-100 align-top dark:border-slate-800" data-testid={`token-${t.id}`}>
                  <td className="px-4 py-2">{t.name}</td>
                  {everyone && <td className="px-4 py-2">{t.owner}</td>}
                  <td className="px-4 py-2" data-testid="token-scope">{t.scope}</td>
                  <td className="num px-4 py-2 text-xs">{formatDateTime(t.createdAt)}</td>
                  <td className="num px-4 py-2 text-xs">{formatDateTime(t.lastUsedAt)}</td>
                  <td className="px-4 py-2">
                    {t.revokedAt ? (
                      <span className="text-xs text-slate-500">
                        {t.revokedReason === "owner_disabled" ? "revoked when its owner was disabled" : "revoked"} {formatDateTime(t.revokedAt)}
                      </span>
                    ) : (
                      <ActionForm action={revokeTokenAction} fields={{ tokenId: t.id }} label="Revoke" testId={`revoke-${t.id}`}
                        confirm={`Revoke "${t.name}"? Every build or script that uses it stops working at once; this cannot be undone.`} />
                    )}
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        )}
      </section>
      <section className="card p-4">
        <h2 className="mb-3 font-semibold">New token</h2>
        <TokenCreateForm create={createTokenAction} canPromote={roleAtLeast(me.role, "lead")} />
      </section>
    </div>
  );
}
